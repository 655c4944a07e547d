// The worker's message protocol, driven in Node with frames rendered by ffmpeg.
// Source of truth: the generator's own formula (support/synthetic-clips.ts); the protocol is ours.
import { describe, expect, it, vi } from "vitest";
import type { FromWorker } from "../../../src/features/digitise/tracking/protocol";
import { createTrackHost } from "../../../src/features/digitise/tracking/track-host";
import { HIDDEN_FROM, occludedClip } from "./support/scenarios";
import { memorySource } from "./support/synthetic-clips";
import { framesOf } from "./support/track-clip";

// Each clip is rendered by ffmpeg first: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

const spec = occludedClip();

async function host() {
  const frames = await framesOf(spec);
  const posted: FromWorker[] = [];
  const h = createTrackHost({ post: (m) => posted.push(m), source: (_, length) => ({ ...memorySource(frames), length }) });
  return { h, posted };
}

// Page numbering starts at 1 here: page frame n is clip frame n − 1.
const frames = { urlTemplate: "/frames/{frame:6}.jpg", first: 1, last: 260 };
const startAt = (n: number) => ({ frame: n + 1, ...spec.truth(n) });

describe("track worker host", () => {
  it("posts a proposal and a progress per frame, then one done, all in page numbering", async () => {
    const { h, posted } = await host();
    await h.handle({ type: "start", runId: 7, frames, start: startAt(0), options: { direction: 1 } });
    const done = posted.at(-1)!;
    expect(done).toMatchObject({ type: "done", runId: 7, reason: "low-confidence", frame: HIDDEN_FROM + 1, proposals: HIDDEN_FROM - 1 });
    const proposals = posted.filter((m) => m.type === "proposal");
    const progress = posted.filter((m) => m.type === "progress");
    expect(proposals).toHaveLength(HIDDEN_FROM - 1);
    expect(progress.at(-1)).toEqual({ type: "progress", runId: 7, done: HIDDEN_FROM - 1, total: 259 });
    expect(posted.slice(0, 2).map((m) => m.type)).toEqual(["proposal", "progress"]);
    const first = proposals[0] as Extract<FromWorker, { type: "proposal" }>;
    expect(first.frame).toBe(2);
    expect(Math.hypot(first.x - spec.truth(1).x, first.y - spec.truth(1).y)).toBeLessThan(1);
    expect(posted.filter((m) => m.type === "done" || m.type === "error")).toHaveLength(1);
  });

  it("cancels a run on request", async () => {
    const { h, posted } = await host();
    const run = h.handle({ type: "start", runId: 1, frames, start: startAt(0), options: { direction: 1 } });
    while (posted.filter((m) => m.type === "proposal").length < 3) await new Promise((r) => setTimeout(r, 1));
    h.handle({ type: "cancel", runId: 1 });
    await run;
    expect(posted.at(-1)).toMatchObject({ type: "done", runId: 1, reason: "cancelled" });
  });

  it("lets a new start replace the run before it", async () => {
    const { h, posted } = await host();
    const one = h.handle({ type: "start", runId: 1, frames, start: startAt(0), options: { direction: 1 } });
    const two = h.handle({ type: "start", runId: 2, frames, start: startAt(200), options: { direction: 1, maxFrames: 5 } });
    await Promise.all([one, two]);
    const ends = posted.filter((m) => m.type === "done");
    expect(ends).toEqual([
      expect.objectContaining({ runId: 1, reason: "cancelled" }),
      expect.objectContaining({ runId: 2, reason: "end-of-range", proposals: 5 }),
    ]);
  });

  it.each([
    [{ type: "start", runId: 3, frames, start: startAt(0), options: { direction: 2 } }, "options.direction"],
    [{ type: "start", runId: 3, frames: { urlTemplate: "/frames/x.jpg", first: 1, last: 9 }, start: startAt(0), options: { direction: 1 } }, "frames.urlTemplate"],
    [{ type: "start", runId: 3, frames, start: { frame: 0, x: 1, y: 1 }, options: { direction: 1 } }, undefined],
    [{ type: "start", runId: 3, frames, start: startAt(0), options: { direction: 1, templateSize: 2 } }, "options.templateSize"],
  ])("answers a bad start with one error naming the field (%#)", async (msg, field) => {
    const { h, posted } = await host();
    await h.handle(msg);
    expect(posted).toHaveLength(1);
    expect(posted[0]).toMatchObject({ type: "error", runId: 3 });
    expect((posted[0] as { field?: string }).field).toBe(field);
    if (!field) expect((posted[0] as { message: string }).message).toBe("start.frame 0 is outside the frames 1 … 260");
  });
});
