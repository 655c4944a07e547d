// Two identical blobs inside the first search window: the assist must not pick one by chance.
// [CP] common practice, no source: the ambiguity rule is the engine's own contract (decision 032).
import { expect, it } from "vitest";
import { track } from "../../../shared/tracking/track";
import type { GrayFrame } from "../../../shared/tracking/types";

const blobs = (centres: [number, number][]): GrayFrame => {
  const [w, h] = [200, 120];
  const data = new Uint8Array(w * h);
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) {
      let v = 60;
      for (const [cx, cy] of centres) v += 140 * Math.exp(-((x + 0.5 - cx) ** 2 + (y + 0.5 - cy) ** 2) / 40);
      data[y * w + x] = Math.min(255, Math.round(v));
    }
  return { width: w, height: h, data };
};

it("stops as ambiguous when a twin appears within reach, and tracks on when the margin check is off", async () => {
  const frames = [blobs([[80, 60]]), blobs([[81, 60], [111, 60]]), blobs([[82, 60], [112, 60]])];
  const source = { length: 3, frame: async (i: number) => frames[i] };
  const strict = await track({ frames: source, start: { frame: 0, x: 80, y: 60 }, direction: 1, turning: false });
  expect(strict.stop.reason).toBe("ambiguous");
  expect(strict.stop.frame).toBe(1);
  expect(strict.proposals).toEqual([]);
  const loose = await track({ frames: source, start: { frame: 0, x: 80, y: 60 }, direction: 1, turning: false, minPeakMargin: 0 });
  expect(loose.stop.reason).toBe("end-of-range");
  expect(loose.proposals).toHaveLength(2);
});
