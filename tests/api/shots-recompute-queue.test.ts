// Recomputing many shots is the job queue's work, never a request's: a calibration change or a
// bench test answers without running the engine, the shots say "recomputing" until the job has
// stored their new results, a burst of calibration writes (a scale bar being dragged) makes at
// most two runs, and the stored numbers after the job are the engine's for the latest inputs.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertReadyClip } from "./routes/shots";
import { computeShot } from "../../shared/mechanics/index";
import { scene as readoutScene } from "./routes/readout";
import { engineCalibration } from "../../shared/schemas/shots";
import { startJobs, stopJobs } from "../../server/jobs/runtime";

// Every engine run of this process (web side and, once started, the in-process worker) is counted.
const engine = vi.hoisted(() => ({ runs: 0 }));
vi.mock("../../server/cpu/pool", async (original) => {
  const m = await original<typeof import("../../server/cpu/pool")>();
  return {
    ...m,
    offLoop: ((task, input) => {
      if (task === "computeShot") engine.runs++;
      return m.offLoop(task, input);
    }) as typeof m.offLoop,
  };
});

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let analyst: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
  await startJobs({ work: false }); // first only queued: nothing runs the jobs until a test starts the worker
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
});

const T = () => `/api/teams/${world.teamId}`;

// The engine's made-up slap shot with a known exit speed, on the clip's frame numbers.
const scene = () => readoutScene({ seed: "recompute-queue" });

async function digitisedShots(n: number, stickId: string | null = null) {
  const clipId = await insertReadyClip(world.teamId, { frameCount: 400, width: 2000, height: 720, captureFps: 3200 });
  const s = scene();
  const shots: string[] = [];
  for (let i = 0; i < n; i++) {
    const shot = (await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 400, stickId, label: `Queued ${i + 1}` })).json;
    const saved = await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: s.marks, events: s.events });
    expect(saved.status, saved.text).toBe(200);
    shots.push(shot.id);
  }
  return { clipId, shots, s };
}

/** Where the numbers appear: the Digitise document, the readout, the clip's shots, the Shots list. */
async function recomputingEverywhere(clipId: string, shotId: string) {
  const [doc, readout, ofClip, list] = await Promise.all([
    analyst.get(`${T()}/shots/${shotId}`),
    analyst.get(`${T()}/readout/shots/${shotId}`),
    analyst.get(`${T()}/clips/${clipId}/shots`),
    analyst.get(`${T()}/readout/shots?pageSize=100`),
  ]);
  return {
    doc: doc.json.storedResult?.recomputing,
    readout: readout.json.recomputing,
    ofClip: ofClip.json.shots.find((x: { id: string }) => x.id === shotId)?.result?.recomputing,
    list: list.json.shots.find((x: { id: string }) => x.id === shotId)?.recomputing,
  };
}

async function untilRecomputed(clipId: string, shotId: string, timeoutMs = 30_000) {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if ((await recomputingEverywhere(clipId, shotId)).doc === false) return (await analyst.get(`${T()}/shots/${shotId}`)).json;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error("the recompute job did not store new results in time");
}

async function startWorker() {
  await stopJobs();
  await startJobs({ work: true });
}

describe("recompute on the job queue", () => {
  it("a calibration change and a bench test answer without running the engine; every page says recomputing until the job stores the right numbers", async () => {
    const st = await analyst.post(`${T()}/sticks`, { label: "Queue 85", ratedFlex: 85 });
    expect(st.status, st.text).toBe(201);
    const { clipId, shots, s } = await digitisedShots(3, st.json.id);
    const before = (await analyst.get(`${T()}/shots/${shots[0]}`)).json.storedResult;
    expect(before).toMatchObject({ results: null });

    const runs = engine.runs;
    const cal = await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: s.calibration });
    expect(cal.status, cal.text).toBe(200);
    expect(engine.runs - runs, "engine runs inside the calibration request").toBe(0);
    expect(before.recomputing).toBe(false);
    expect(await recomputingEverywhere(clipId, shots[0])).toEqual({ doc: true, readout: true, ofClip: true, list: true });
    // Until then the previous results stay (here: none), never half-new ones.
    expect((await analyst.get(`${T()}/shots/${shots[0]}`)).json.storedResult).toMatchObject({ results: null, computedAt: before.computedAt });

    const bench = await analyst.post(`${T()}/sticks/${st.json.id}/bench-tests`, {
      date: "2026-01-02", loadUnit: "lbf", deflectionUnit: "in",
      readings: [{ load: 20, deflection: 0.28 }, { load: 40, deflection: 0.56 }, { load: 60, deflection: 0.84 }, { load: 80, deflection: 1.12 }],
    });
    expect(bench.status, bench.text).toBe(201);
    expect(engine.runs - runs, "engine runs inside the bench test request").toBe(0);

    await startWorker();
    const after = await untilRecomputed(clipId, shots[0]);
    for (const id of shots.slice(1)) await untilRecomputed(clipId, id);
    expect(await recomputingEverywhere(clipId, shots[0])).toEqual({ doc: false, readout: false, ofClip: false, list: false });
    // The job's numbers are the engine's for the same document, calibration and the bench test's flex.
    expect(after.stick).toMatchObject({ flexSource: "measured" });
    const direct = computeShot({
      captureFps: 3200, calibration: engineCalibration(s.calibration), tracks: s.marks, events: s.events, frameRange: [1, 400],
      stick: { flex: after.stick.flex, benchSpanMm: after.stick.benchSpanMm },
    });
    expect(after.storedResult.error).toBeNull();
    expect(after.storedResult.results.puckExitSpeed.valueMps).toBeCloseTo(direct.puckExitSpeed.valueMps, 9);
    expect(after.storedResult.results.storedEnergy.valueJ).toBeCloseTo(direct.storedEnergy!.valueJ, 9);
    // Two triggers (clip, stick) while nothing ran: at most one run per trigger for each shot.
    expect(engine.runs - runs).toBeLessThanOrEqual(2 * shots.length);
  });

  it("twenty rapid calibration writes make at most two recomputes, and the stored numbers follow the last one", async () => {
    await startWorker();
    const { clipId, shots, s } = await digitisedShots(1);
    const runs = engine.runs;
    let last = s.calibration.lengthMm;
    for (let i = 1; i <= 20; i++) {
      last = s.calibration.lengthMm * (1 + i / 100);
      const r = await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: engineCalibration({ ...s.calibration, lengthMm: last }) });
      expect(r.status, r.text).toBe(200);
    }
    // Let the run (and any second one that was waiting) finish, then count.
    await new Promise((r) => setTimeout(r, 3000));
    expect(engine.runs - runs, "engine runs for twenty writes").toBeLessThanOrEqual(2);
    const after = await untilRecomputed(clipId, shots[0]);
    expect(engine.runs - runs).toBeGreaterThanOrEqual(1);
    const final = (await analyst.get(`${T()}/shots/${shots[0]}`)).json.storedResult;
    const direct = computeShot({ captureFps: 3200, calibration: engineCalibration({ ...s.calibration, lengthMm: last }), tracks: s.marks, events: s.events, frameRange: [1, 400], stick: null });
    expect(final.recomputing).toBe(false);
    expect(final.results.puckExitSpeed.valueMps).toBeCloseTo(direct.puckExitSpeed.valueMps, 9);
    expect(after.storedResult.results).not.toBeNull();
  });
});
