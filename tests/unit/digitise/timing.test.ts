// Times come from the clip's frame clock; the default playback speed follows the capture rate.
import { describe, expect, it } from "vitest";
import { frameClock } from "@shared/frame-clock";
import { formatMs, msSince, msSinceFirst } from "@/features/digitise/model/timing";
import { defaultFraction, fractionChoices, fractionLabel, shownText } from "@/components/shot/playback/speed";
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
  it("the default playback speed shows about 30 frames a second whatever the capture rate", () => {
    expect(defaultFraction(3200)).toBeCloseTo(30 / 3200, 12);
    expect(fractionLabel(defaultFraction(3200))).toBe("1/107 real time");
    expect(fractionChoices(3200)).toContain(defaultFraction(3200));
    // 3,000 fps: 1/100 is within 2 %, so that usual speed is the default and offered once.
    expect(defaultFraction(3000)).toBe(1 / 100);
    expect(fractionChoices(3000).filter((f) => f === 1 / 100)).toHaveLength(1);
    expect(defaultFraction(240)).toBe(1 / 8);
    expect(defaultFraction(25)).toBe(1);
    expect(shownText(3200, defaultFraction(3200))).toBe("30 frames/s");
    expect(shownText(3200, 1 / 10)).toBe("60 frames/s (skipping)");
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
