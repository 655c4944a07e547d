// The page's tracking client against the real worker host, joined by an in-process fake Worker
// that delivers messages asynchronously as postMessage does. [CP] common practice, no source: the
// protocol is ours; the frames' truth is the generator's own formula (support/synthetic-clips.ts).
import { describe, expect, it, vi } from "vitest";
import { createTrackingClient, TrackRunError, type WorkerLike } from "../../../src/features/digitise/tracking/client";
import { createTrackHost } from "../../../src/features/digitise/tracking/track-host";
import { HIDDEN_FROM, occludedClip } from "./support/scenarios";
import { memorySource } from "./support/synthetic-clips";
import { framesOf } from "./support/track-clip";

// Each clip is rendered by ffmpeg first: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

const spec = occludedClip();
const frames = { urls: Array.from({ length: 260 }, (_, i) => `/f/${i}`), first: 0 };

async function fakeWorker() {
  const clip = await framesOf(spec);
  const worker: WorkerLike & { terminated: boolean } = {
    terminated: false,
    onmessage: null,
    onerror: null,
    postMessage: (m) => setTimeout(() => void host.handle(structuredClone(m)), 0),
    terminate() {
      this.terminated = true;
    },
  };
  const host = createTrackHost({
    post: (m) => setTimeout(() => worker.onmessage?.({ data: structuredClone(m) } as MessageEvent), 0),
    source: (_, length) => ({ ...memorySource(clip), length }),
  });
  return worker;
}

describe("tracking client", () => {
  it("streams proposals and progress, then resolves with the stop", async () => {
    const worker = await fakeWorker();
    const client = createTrackingClient(() => worker);
    const proposals: number[] = [];
    const progress: [number, number][] = [];
    const run = client.start(
      { frames, start: { frame: 0, ...spec.truth(0) }, options: { direction: 1 } },
      { onProposal: (p) => proposals.push(p.frame), onProgress: (d, t) => progress.push([d, t]) },
    );
    const done = await run.finished;
    expect(done).toMatchObject({ reason: "low-confidence", frame: HIDDEN_FROM, proposals: HIDDEN_FROM - 1 });
    expect(proposals).toEqual(Array.from({ length: HIDDEN_FROM - 1 }, (_, i) => i + 1));
    expect(progress.at(-1)).toEqual([HIDDEN_FROM - 1, 259]);
    client.dispose();
    expect(worker.terminated).toBe(true);
  });

  it("cancels the running track when a new one starts, and on cancel()", async () => {
    const worker = await fakeWorker();
    const client = createTrackingClient(() => worker);
    const first = client.start({ frames, start: { frame: 0, ...spec.truth(0) }, options: { direction: 1 } });
    const second = client.start({ frames, start: { frame: 259, ...spec.truth(259) }, options: { direction: -1 } });
    second.cancel();
    expect((await first.finished).reason).toBe("cancelled");
    expect((await second.finished).reason).toBe("cancelled");
  });

  it("rejects with the field of a bad request", async () => {
    const client = createTrackingClient(await fakeWorker().then((w) => () => w));
    const run = client.start({ frames, start: { frame: 0, x: 10, y: 10 }, options: { direction: 1, threshold: 3 } });
    const err = await run.finished.catch((e) => e);
    expect(err).toBeInstanceOf(TrackRunError);
    expect(err.field).toBe("options.threshold");
  });

  it("rejects every pending run when the worker itself fails", async () => {
    const worker = await fakeWorker();
    worker.postMessage = () => {};
    const client = createTrackingClient(() => worker);
    const run = client.start({ frames, start: { frame: 0, x: 10, y: 10 }, options: { direction: 1 } });
    worker.onerror?.({ message: "script failed to load" } as ErrorEvent);
    await expect(run.finished).rejects.toThrow("the tracking worker failed: script failed to load");
  });
});
