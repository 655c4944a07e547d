// Bad requests fail before any frame is matched, with one line that names the option.
// [CP] common practice, no source: the checks are the engine's own contract.
import { describe, expect, it } from "vitest";
import { TrackInputError } from "../../../shared/tracking/errors";
import { track } from "../../../shared/tracking/track";
import type { FrameSource, GrayFrame, TrackRequest } from "../../../shared/tracking/types";

const frame = (width = 64, height = 48): GrayFrame => ({ width, height, data: new Uint8Array(width * height).map((_, i) => (i * 37) % 251) });
const source = (n = 10, make = () => frame()): FrameSource => ({ length: n, frame: async () => make() });
const ok: TrackRequest = { frames: source(), start: { frame: 2, x: 32, y: 24 }, direction: 1, templateSize: 16 };

describe("track rejects bad requests", () => {
  it.each<[string, Partial<TrackRequest> | Record<string, unknown>, string]>([
    ["no frames", { frames: undefined }, "frames: a frame source"],
    ["an empty source", { frames: source(0) }, "frames: a frame source with a length of 1 or more"],
    ["direction 0", { direction: 0 }, "direction: must be 1 or -1 (got 0)"],
    ["a start frame past the end", { start: { frame: 10, x: 1, y: 1 } }, "start.frame: must be a whole frame number from 0 to 9 (got 10)"],
    ["a fractional start frame", { start: { frame: 1.5, x: 1, y: 1 } }, "start.frame: must be a whole frame number"],
    ["a coordinate that is not a number", { start: { frame: 1, x: Number.NaN, y: 1 } }, "start: coordinates must be finite numbers"],
    ["a prior on the start frame", { prior: { frame: 2, x: 30, y: 20 } }, "prior.frame: must differ from start.frame"],
    ["a template of 4 px", { templateSize: 4 }, "templateSize: must be a whole number from 8 to 256 (got 4)"],
    ["a threshold of 1.5", { threshold: 1.5 }, "threshold: must be a number from 0.05 to 0.99 (got 1.5)"],
    ["maxFrames 0", { maxFrames: 0 }, "maxFrames: must be a whole number from 1"],
    ["turning as a string", { turning: "yes" }, "turning: must be true or false (got yes)"],
    ["a start mark outside the frame", { start: { frame: 2, x: 70, y: 10 } }, "start: (70, 10) lies outside the 64×48 frame"],
    ["a template far larger than the frame", { frames: source(10, () => frame(20, 20)), start: { frame: 2, x: 10, y: 10 }, templateSize: 48 }, "templateSize: a 48 px template around (10, 10) keeps less than 24 px inside the 20×20 frame"],
  ])("%s", async (_, change, message) => {
    const err = await track({ ...ok, ...change } as TrackRequest).catch((e) => e);
    expect(err).toBeInstanceOf(TrackInputError);
    expect(err.message).toContain(message);
  });
});

describe("track reports unreadable frames", () => {
  it("a frame of another size names both sizes", async () => {
    let calls = 0;
    const frames = source(10, () => (calls++ === 0 ? frame() : frame(32, 32)));
    await expect(track({ ...ok, frames })).rejects.toThrow("frame 3 is 32×32 but the start frame is 64×48");
  });

  it("a frame that is not width × height bytes", async () => {
    const frames = source(10, () => ({ width: 64, height: 48, data: new Uint8Array(10) }));
    await expect(track({ ...ok, frames })).rejects.toThrow("frame 2 is not an 8-bit grayscale frame");
  });

  it("a source that fails passes its error on", async () => {
    const frames: FrameSource = { length: 10, frame: async (i) => (i === 2 ? frame() : Promise.reject(new Error(`frame image ${i} answered 404`))) };
    await expect(track({ ...ok, frames })).rejects.toThrow("frame image 3 answered 404");
  });

  it("a run that starts at the last frame has nothing to propose", async () => {
    const { proposals, stop } = await track({ ...ok, start: { frame: 9, x: 32, y: 24 } });
    expect(proposals).toEqual([]);
    expect(stop.reason).toBe("end-of-range");
  });
});
