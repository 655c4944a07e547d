// A landmark lost mid-shot in an auto-digitise run: on the generated 1,000 fps slap shot
// (support/shot-clips.ts) the top hand is hidden from frame 60 on behind a flat grey box that
// moves with it (another player passing in front of the camera). The run stops that landmark at
// frame 60 saying why, proposes nothing for it from there, and the other landmarks go on; what the
// run stores (buildProposals) carries the frame and the reason. Source of truth: the scene's own
// analytic positions (scripts/demo/shot-scene.ts).
import { describe, expect, it, vi } from "vitest";
import { buildProposals } from "../../../server/tracking/proposals";
import type { Landmark } from "../../../shared/schemas/shot-document";
import { trackShot } from "../../../shared/tracking/shot-tracker";
import type { FrameSource, GrayFrame } from "../../../shared/tracking/types";
import { seedsAt, shotClip, TRACK_SHOTS } from "./support/shot-clips";

vi.setConfig({ testTimeout: 300_000 });

const HIDDEN_FROM = 60;
const BOX = 36; // px each side of the hand's centre: the whole glove and the template around it

describe("a landmark hidden mid-shot", () => {
  it("stops at the first hidden frame with its reason, proposes nothing after, and the others track on", async () => {
    const clip = await shotClip(TRACK_SHOTS[1000]);
    const hand = new Map(clip.truth.tracks.topHand.map((m) => [m[0], m]));
    const hide = (f: number, src: GrayFrame): GrayFrame => {
      const m = hand.get(f);
      if (f < HIDDEN_FROM || !m) return src;
      const data = src.data.slice();
      for (let y = Math.max(0, Math.round(m[2]) - BOX); y < Math.min(src.height, Math.round(m[2]) + BOX); y++)
        data.fill(128, y * src.width + Math.max(0, Math.round(m[1]) - BOX), y * src.width + Math.min(src.width, Math.round(m[1]) + BOX));
      return { ...src, data };
    };
    const frames: FrameSource = { length: clip.source.length, frame: async (i) => hide(i, await clip.source.frame(i)) };
    const seeds = seedsAt(clip.truth, 1) as Partial<Record<Landmark, [number, number]>>;
    const result = await trackShot({ frames, first: 1, last: clip.truth.frameCount, seedFrame: 1, seeds });

    const top = result.tracks.topHand!;
    expect(["low-confidence", "ambiguous"]).toContain(top.forward.reason);
    expect(top.forward.frame).toBe(HIDDEN_FROM);
    expect(top.forward.message).toContain(`frame ${HIDDEN_FROM}`);
    expect(top.proposals.at(-1)!.frame).toBe(HIDDEN_FROM - 1);
    const errors = top.proposals.map((p) => Math.hypot(p.x - hand.get(p.frame)![1], p.y - hand.get(p.frame)![2]));
    expect(errors.reduce((a, e) => a + e, 0) / errors.length).toBeLessThan(0.5);
    // The other landmarks are not held up by it.
    for (const k of ["bladeHeel", "bladeToe", "bottomHand"] as const) expect(result.tracks[k]!.forward.reason, k).toBe("end-of-range");

    // Stored as the run's proposals: the stop's frame and reason, and no mark from it on.
    const stored = buildProposals(1, seeds, result, { calibrated: true });
    expect(stored.tracks.topHand!.forward).toMatchObject({ reason: top.forward.reason, frame: HIDDEN_FROM });
    expect(stored.tracks.topHand!.marks.every((m) => m[0] < HIDDEN_FROM)).toBe(true);
  });
});
