// Times come from the capture rate; playback at a fraction of real time carries its remainder.
import { describe, expect, it } from "vitest";
import { frameClock } from "@shared/frame-clock";
import { formatMs, msSince, msSinceFirst, playbackAdvance } from "@/features/digitise/model/timing";
import { lowerBound, markAt, neighbourFrame, trailBefore, withMark, withoutMark } from "@/features/digitise/model/tracks";

describe("timing", () => {
  it("frame 1 is 0 ms; at 3,200 fps a frame is 0.3125 ms", () => {
    const clock = frameClock(null, 3200);
    expect(msSinceFirst(1, { clock, startMs: 0, frameStart: 1 })).toBe(0);
    expect(msSinceFirst(33, { clock, startMs: 0, frameStart: 1 })).toBe(10);
    expect(msSince(180, 184, clock)).toBe(-1.25);
    expect(formatMs(-1.25, 3200)).toBe("−1.250 ms");
    expect(formatMs(12.5, 240)).toBe("+12.50 ms");
  });
  it("1/100 of real time at 3,200 fps shows 32 frames a second, whatever the tick sizes", () => {
    let carry = 0;
    let frames = 0;
    for (let i = 0; i < 60; i++) {
      const r = playbackAdvance(carry, 1000 / 60, 3200, 1 / 100);
      carry = r.carry;
      frames += r.frames;
    }
    expect(frames).toBe(32);
  });
});

describe("tracks", () => {
  it("keep marks sorted, one per frame, without changing the original", () => {
    const t0 = withMark(undefined, 5, 1, 1);
    const t1 = withMark(t0, 2, 2, 2);
    const t2 = withMark(t1, 5, 9, 9);
    expect(t0).toEqual([[5, 1, 1]]);
    expect(t2).toEqual([[2, 2, 2], [5, 9, 9]]);
    expect(markAt(t2, 5)).toEqual([5, 9, 9]);
    expect(markAt(t2, 3)).toBeNull();
    expect(withoutMark(t2, 2)).toEqual([[5, 9, 9]]);
    expect(lowerBound(t2, 3)).toBe(1);
    expect(trailBefore([[1, 0, 0], [2, 0, 0], [3, 0, 0], [4, 0, 0]], 4, 2)).toEqual([[2, 0, 0], [3, 0, 0]]);
    expect(neighbourFrame(t2, 5, -1)).toBe(2);
    expect(neighbourFrame(t2, 2, 1)).toBe(5);
    expect(neighbourFrame(t2, 5, 1)).toBeNull();
  });
});
