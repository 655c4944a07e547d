// One frame's search: the template at the predicted angle, placed around the predicted position;
// the search widens when the best match sits on the window's edge, and the angle is stepped while
// a turned template matches better.
import type { Matcher } from "./matcher";
import { findPeak, type Peak } from "./peak";
import { templateAt, type Reference } from "./reference";
import { refinePlacement } from "./refine";
import { planSearch, type SearchPlan } from "./template";
import type { GrayFrame } from "./types";

/** Angle step of the turning search (rad): a 48 px template's corners move about 1 px. */
export const TURN_STEP = 0.03;
/** Steps tried beyond the first neighbour on the better side. */
const TURN_WALK = 3;
/** Search widenings (radius doubled) tried when the best match sits on the window's edge. */
const WIDENINGS = 2;

export interface SearchContext {
  matcher: Matcher;
  minSize: number;
  /** Radius around the peak inside which other maxima belong to the same peak. */
  exclusion: number;
}

export interface FrameMatch {
  x: number;
  y: number;
  peak: Peak;
  /** Refined angle of the landmark relative to the reference. */
  angle: number;
  /** The template had to be cut short at the frame edge. */
  cropped: boolean;
}

interface Attempt {
  plan: SearchPlan;
  peak: Peak;
  cropped: boolean;
}

export function searchFrame(
  frame: GrayFrame,
  ref: Reference,
  predicted: { x: number; y: number },
  predictedAngle: number,
  startRadius: number,
  ctx: SearchContext,
): FrameMatch | null {
  let radius = startRadius;
  const attempt = (angle: number): Attempt | null => {
    const tpl = templateAt(ref, angle, ctx.matcher);
    const plan = planSearch(frame, tpl, predicted, radius, ctx.minSize);
    if (!plan) return null;
    return { plan, peak: findPeak(ctx.matcher.match(frame, plan.window, plan.template), ctx.exclusion), cropped: plan.template !== tpl.patch };
  };
  let centre = attempt(predictedAngle);
  if (!centre) return null;
  for (let w = 0; w < WIDENINGS && centre.peak.onBorder; w++) {
    radius *= 2;
    const wider = attempt(predictedAngle);
    if (!wider) break;
    centre = wider;
  }
  if (!ref.source) return refined(frame, centre, centre.plan.template, 0);

  // Steps k·TURN_STEP around the predicted angle; walk towards the better neighbour while it improves.
  const tried = new Map<number, Attempt | null>([[0, centre]]);
  const at = (k: number) => {
    if (!tried.has(k)) tried.set(k, attempt(predictedAngle + k * TURN_STEP));
    return tried.get(k)!;
  };
  const score = (k: number) => at(k)?.peak.score ?? -Infinity;
  let best = 0;
  const side = score(1) > score(-1) ? 1 : -1;
  for (let k = side; Math.abs(k) <= TURN_WALK + 1 && score(k) > score(best); k += side) best = k;
  const [l, c, r] = [score(best - 1), score(best), score(best + 1)];
  const curve = l - 2 * c + r;
  const offset = curve < 0 && Number.isFinite(curve) ? Math.max(-0.5, Math.min(0.5, (l - r) / (2 * curve))) : 0;
  const chosen = at(best)!;
  const angle = predictedAngle + (best + offset) * TURN_STEP;
  // Refined against the template at the refined angle, cropped the same way as the one matched.
  const turned = templateAt(ref, angle, ctx.matcher);
  const replan = planSearch(frame, turned, predicted, radius, ctx.minSize);
  const template = replan && replan.template.width === chosen.plan.template.width && replan.template.height === chosen.plan.template.height ? replan.template : chosen.plan.template;
  return refined(frame, chosen, template, angle);
}

/** The placement refined to sub-pixel (falling back to the score-map fit), as the landmark position. */
function refined(frame: GrayFrame, a: Attempt, template: GrayFrame, angle: number): FrameMatch {
  const ox = a.plan.window.x + a.peak.x;
  const oy = a.plan.window.y + a.peak.y;
  const r = a.peak.onBorder ? null : refinePlacement(frame, template, ox, oy);
  return { x: (r?.x ?? ox) + a.plan.ax, y: (r?.y ?? oy) + a.plan.ay, peak: a.peak, angle, cropped: a.cropped };
}
