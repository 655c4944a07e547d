// How a puck is followed: by its outline alone. The template is sized to the puck found on the
// start frame, its mask is a ring along the puck's edge (a little of the ice outside, a pixel of
// the puck inside), so the blade beside it and a print turning on it take no part, and it is
// never re-learnt (an outline does not change; a learnt look would hold blur and print).
import type { LandmarkOptions } from "./landmark-tracker";
import { findPuckSilhouette, type PuckSilhouette } from "./puck-silhouette";
import type { Region } from "./regions";
import type { FrameMark, GrayFrame } from "./types";

/** Ring of the puck's mask: this far outside and inside its edge, px. */
const RING_OUT = 3;
const RING_IN = 1;

/** The puck's box at (x, y): its outline's ring (for its own mask) or its whole area (to leave it out of others'). */
export function puckRegion(p: { x: number; y: number }, s: PuckSilhouette, ring: boolean): Region {
  const halfW = s.widthPx / 2, halfH = s.heightPx / 2;
  return ring
    ? { kind: "box", cx: p.x, cy: p.y, halfW: halfW + RING_OUT, halfH: halfH + RING_OUT, inner: { halfW: halfW - RING_IN, halfH: halfH - RING_IN } }
    : { kind: "box", cx: p.x, cy: p.y, halfW, halfH };
}

/** Template options for a puck of this outline. */
export function puckTemplateOptions(s: PuckSilhouette): Pick<LandmarkOptions, "turning" | "templateSize" | "include" | "renew"> {
  return {
    turning: false,
    templateSize: Math.min(160, Math.max(24, Math.ceil(Math.max(s.widthPx, s.heightPx) + 2 * RING_OUT + 8))),
    include: (x, y) => [puckRegion({ x, y }, s, true)],
    renew: false,
  };
}

/** The puck's options from the start frame, or none (plain template) when no clear puck is there. */
export function puckOptions(first: GrayFrame, start: FrameMark): Partial<LandmarkOptions> {
  const s = findPuckSilhouette(first, start.x, start.y);
  return s && !s.doubt ? puckTemplateOptions(s) : {};
}
