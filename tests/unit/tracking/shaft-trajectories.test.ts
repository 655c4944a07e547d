// A point near the free end of a bar turning about its other end (like the blade end of a shaft),
// tracked over 500 noisy frames against its known trajectory.
// Source of truth: the generator's own formula (support/synthetic-clips.ts, checked in clips.test.ts).
import { describe, expect, it, vi } from "vitest";
import { shaftClip } from "./support/scenarios";
import { expectAccurateThroughout } from "./support/metrics";
import { trackClip } from "./support/track-clip";

// Each clip is rendered by ffmpeg first: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

describe.each([240, 1000])("a turning bar at %i fps with noise, over 500 frames", (fps) => {
  it("mean error under 1 px and no drift", async () => {
    const { result, stats } = await trackClip(shaftClip(fps));
    expectAccurateThroughout(result.stop, stats, 500, expect);
  });
});

it("without the turning search the point slides off the bar: the search is what keeps it", async () => {
  const { stats } = await trackClip(shaftClip(240), { turning: false });
  expect(stats.tailMean).toBeGreaterThan(3);
});
