// A clip's timing irregularities in words (Clip page warning) and the strip's marks (Digitise).
import { describe, expect, it } from "vitest";
import { describeClipTiming, type ClipTiming } from "../../../shared/schemas/clips";
import { shotIrregularities } from "../../../src/features/digitise/model/timing";

const timing = (over: Partial<ClipTiming>): ClipTiming => ({ clock: "uneven", nominalFps: 240, tickS: 1e-6, gaps: [], gapCount: 0, repeats: [], repeatCount: 0, missingTail: null, ...over });

describe("describeClipTiming", () => {
  it("names each gap, repeat and missing end by frame, and counts the rest", () => {
    const lines = describeClipTiming(timing({ gaps: [{ after: 100, missing: 3 }, { after: 200, missing: 1 }], gapCount: 2, repeats: [150], repeatCount: 3, missingTail: { from: 301, to: 480 } }), 5);
    expect(lines).toEqual([
      "After frame 100: about 3 frames missing",
      "After frame 200: about 1 frame missing",
      "Frame 150 repeats the time of frame 149",
      "…and 2 more repeated frames",
      "Frames 301–480, promised by the file's header, are missing (the file was cut or damaged)",
    ]);
    expect(describeClipTiming(timing({ gaps: [{ after: 1, missing: 1 }, { after: 5, missing: 2 }], gapCount: 7 }), 1)).toEqual(["After frame 1: about 1 frame missing", "…and 6 more gaps"]);
  });
});

describe("shotIrregularities", () => {
  it("finds the gap and the repeat in a shot's own times, none without them", () => {
    const seconds = [0, 1, 2, 5, 6, 6, 7].map((i) => i / 1000);
    const found = shotIrregularities({ firstFrame: 10, seconds }, 1000);
    expect(found.map((g) => [g.kind, g.from])).toEqual([["gap", 12], ["repeat", 14]]);
    expect(shotIrregularities(null, 1000)).toEqual([]);
    expect(shotIrregularities({ firstFrame: 1, seconds: [0, 0.001, 0.002] }, 1000)).toEqual([]);
  });
});
