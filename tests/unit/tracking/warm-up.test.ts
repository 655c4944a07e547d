// A worker's warm-up (decision 157) tracks its made-up shot for real: every landmark over every
// frame, nothing thrown away silently. Source: the made-up shot's own motion (1 px a frame).
import { expect, it } from "vitest";
import { warmUpTracker } from "../../../shared/tracking/warm-up";

it("tracks all six landmarks of its made-up shot over all its frames", async () => {
  const r = await warmUpTracker();
  expect(r.error).toBeUndefined();
  expect(r.landmarkFrames).toBe(6 * 23);
  expect(r.seconds).toBeGreaterThan(0);
});
