// Stored results: the server recomputes with the mechanics engine whenever marks, events, the
// clip's calibration or the stick (and its bench tests) change, and stores what is missing instead
// of numbers when the marks cannot give any.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { insertReadyClip } from "./routes/shots";
import { computeShot, ENGINE_VERSION } from "../../shared/mechanics/index";
import { scene as readoutScene } from "./routes/readout";
import { engineCalibration } from "../../shared/schemas/shots";
import type { Mark } from "../../shared/schemas/shot-document";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let analyst: Client;

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  analyst = await new Client(srv.url).signIn(EMAILS.analyst);
});
afterAll(() => srv.close());

const T = () => `/api/teams/${world.teamId}`;

// The engine's made-up slap shot (true exit speed 30 m/s), moved onto a 2000 × 720 frame and onto
// the clip's frame numbers (the first frame is 1).
const scene = () => readoutScene({ seed: "shots-api" });

async function digitisedShot(stickId: string | null = null) {
  const clipId = await insertReadyClip(world.teamId, { frameCount: 400, width: 2000, height: 720, captureFps: 3200 });
  const shot = (await analyst.post(`${T()}/clips/${clipId}/shots`, { frameStart: 1, frameEnd: 400, stickId })).json;
  const s = scene();
  const saved = await analyst.put(`${T()}/shots/${shot.id}/marks`, { baseVersion: 1, marks: s.marks, events: s.events });
  expect(saved.status, saved.text).toBe(200);
  return { clipId, shotId: shot.id as string, s, saved: saved.json };
}

describe("recompute on every change", () => {
  it("without a calibration, stores what is missing; with one, the engine's results for the same document", async () => {
    const { clipId, shotId, s, saved } = await digitisedShot();
    expect(saved.storedResult).toMatchObject({ results: null, shotVersion: 2, engineVersion: ENGINE_VERSION });
    expect(saved.storedResult.error).toMatch(/needs a calibration for the clip/);

    const cal = await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: s.calibration });
    expect(cal.status, cal.text).toBe(200);
    const got = (await analyst.get(`${T()}/shots/${shotId}`)).json;
    expect(got.storedResult.error).toBeNull();
    const r = got.storedResult.results;
    // The server is wiring only: its numbers are the engine's on the same document.
    const direct = computeShot({ captureFps: 3200, calibration: engineCalibration(s.calibration), tracks: s.marks, events: s.events, frameRange: [1, 400], stick: null });
    expect(r.puckExitSpeed.valueMps).toBeCloseTo(direct.puckExitSpeed.valueMps, 9);
    expect(r.peakBend.angleDeg).toBeCloseTo(direct.peakBend!.angleDeg, 9);
    // And the synthetic scene's analytic truth ([CP] made-up scene with a known answer).
    expect(Math.abs(r.puckExitSpeed.valueMps - s.truth.exitSpeedMps) / s.truth.exitSpeedMps).toBeLessThan(0.01);
    expect(r.storedEnergy).toBeNull();

    // Twice the known length: every speed doubles (a scale bar is a pure scale).
    await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: { ...s.calibration, lengthMm: 2 * s.calibration.lengthMm } });
    const doubled = (await analyst.get(`${T()}/shots/${shotId}`)).json.storedResult.results;
    expect(doubled.puckExitSpeed.valueMps / r.puckExitSpeed.valueMps).toBeCloseTo(2, 9);

    // Removing the calibration takes the numbers away again rather than leaving stale ones.
    await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: null });
    expect((await analyst.get(`${T()}/shots/${shotId}`)).json.storedResult.results).toBeNull();
  });

  it("uses the stick's rated flex, then the measured flex of its latest bench test", async () => {
    const { db } = await import("../../server/db/client");
    const { stick, benchTest } = await import("../../server/db/schema");
    const { recomputeShotsOfStick } = await import("../../server/shots/results");
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "Results 85", ratedFlex: 85 }).returning();
    const { clipId, shotId, s } = await digitisedShot(st.id);
    await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: s.calibration });
    const rated = (await analyst.get(`${T()}/shots/${shotId}`)).json;
    expect(rated.stick).toMatchObject({ flex: 85, flexSource: "rated" });
    const e85 = rated.storedResult.results.storedEnergy.valueJ;
    expect(e85).toBeGreaterThan(0);

    const test = { teamId: world.teamId, stickId: st.id, spanMm: 1000, loadPointMm: 500, readings: [], fit: {}, eiNm2: 1 };
    await db().insert(benchTest).values([{ ...test, testedOn: "2026-01-10", measuredFlex: 80 }, { ...test, testedOn: "2026-02-10", measuredFlex: 68 }]);
    await recomputeShotsOfStick(st.id);
    const measured = (await analyst.get(`${T()}/shots/${shotId}`)).json;
    expect(measured.stick).toMatchObject({ flex: 68, flexSource: "measured", testedOn: "2026-02-10" });
    // U = ½ k_shot δ² with k_shot ∝ EI ∝ flex (issue 5's formula): energy scales with the flex.
    expect(measured.storedResult.results.storedEnergy.valueJ / e85).toBeCloseTo(68 / 85, 9);
  });

  it("recomputes when the stick of the shot changes", async () => {
    const { db } = await import("../../server/db/client");
    const { stick } = await import("../../server/db/schema");
    const [st] = await db().insert(stick).values({ teamId: world.teamId, label: "Swap 100", ratedFlex: 100 }).returning();
    const { clipId, shotId, s } = await digitisedShot();
    await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: s.calibration });
    expect((await analyst.get(`${T()}/shots/${shotId}`)).json.storedResult.results.storedEnergy).toBeNull();
    const r = await analyst.patch(`${T()}/shots/${shotId}`, { stickId: st.id });
    expect(r.status, r.text).toBe(200);
    expect(r.json.storedResult.results.storedEnergy.valueJ).toBeGreaterThan(0);
  });

  it("an engine refusal is stored as the message, with no numbers", async () => {
    const { shotId, s, clipId } = await digitisedShot();
    await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: s.calibration });
    const cur = (await analyst.get(`${T()}/shots/${shotId}`)).json;
    // Keep only two puck marks after release: the engine needs three.
    const rel = s.events.release;
    const puck = (s.marks.puck as Mark[]).filter((m) => m[0] < rel + 2);
    const r = await analyst.put(`${T()}/shots/${shotId}/marks`, { baseVersion: cur.version, marks: { ...s.marks, puck }, events: s.events });
    expect(r.json.storedResult.results).toBeNull();
    expect(r.json.storedResult.error).toMatch(/at least 3 puck marks from release on \(2 so far\)/);
  });

  it("results stored by an earlier engine are computed again by the clip sweep's batch", async () => {
    const { clipId, shotId, s } = await digitisedShot();
    await analyst.put(`${T()}/clips/${clipId}/calibration`, { calibration: s.calibration });
    const { db } = await import("../../server/db/client");
    const { shotResult } = await import("../../server/db/schema");
    const { eq } = await import("drizzle-orm");
    await db().update(shotResult).set({ engineVersion: "mechanics-0.9.0" }).where(eq(shotResult.shotId, shotId));
    expect((await analyst.get(`${T()}/shots/${shotId}`)).json.storedResult.engineVersion).toBe("mechanics-0.9.0");
    const { recomputeOutdatedResults } = await import("../../server/shots/results");
    expect(await recomputeOutdatedResults(1000)).toBeGreaterThanOrEqual(1);
    const got = (await analyst.get(`${T()}/shots/${shotId}`)).json.storedResult;
    expect(got.engineVersion).toBe(ENGINE_VERSION);
    expect(got.results.contactTimeUncertaintyMs).toBeGreaterThan(0);
  });
});
