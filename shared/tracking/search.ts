// One frame's search: the template at the predicted angle, placed around the predicted position
// (the window widens when the best match sits on its edge); then, for a reference that can turn,
// turned templates are tried in a small window around that match while they score better.
import type { Matcher } from "./matcher";
import { findPeak, type Peak } from "./peak";
import { refinePlacement } from "./refine";
import { templateAt, type Reference } from "./reference";
import { coverage, intersect, mayTouch, rasterMask, type Region } from "./regions";
import { planSearch, type SearchPlan } from "./template";
import type { GrayFrame } from "./types";

/** Angle step of the turning search (rad): a 48 px template's corners move about 1 px. */
export const TURN_STEP = 0.03;
/** Steps tried beyond the first neighbour on the better side. */
const TURN_WALK = 3;
/** Radius of the window around the first match in which turned templates are placed. */
const TURN_RADIUS = 3;
/** Search widenings (radius doubled) tried when the best match sits on the window's edge. */
const WIDENINGS = 2;

export interface SearchContext {
  matcher: Matcher;
  minSize: number;
  /** Radius around the peak inside which other maxima belong to the same peak. */
  exclusion: number;
  /** Other tracked objects on this frame: their pixels (grown by excludeMargin) are left out of the match. */
  exclude?: Region[];
  excludeMargin?: number;
  /** false: keep the predicted angle (it is known from other landmarks), search the position only. */
  turnSearch?: boolean;
}

export interface FrameMatch {
  x: number;
  y: number;
  /** Best NCC score, and the strongest rival in the search window. */
  score: number;
  sideLobe: number | null;
  /** The best match of the search window sat on its edge: the true one may lie outside. */
  onBorder: boolean;
  /** Refined angle of the landmark relative to the reference. */
  angle: number;
  /** The template had to be cut short at the frame edge. */
  cropped: boolean;
  /** Another object's pixels were left out of the match. */
  excluded: boolean;
}

interface Attempt {
  plan: SearchPlan;
  peak: Peak;
  cropped: boolean;
  mask: GrayFrame | null;
}

/** Other objects' pixels are left out this far beyond their outline (px). */
const EXCLUDE_MARGIN = 1;
/** Below this share of its own pixels left, the other object covers the landmark: nothing is left out (and nothing learnt). */
const MIN_KEPT = 0.4;

/**
 * The plan's mask without the pixels other objects cover when the template sits around `at`;
 * `excluded` says whether the other objects were in view at all.
 */
function maskFor(plan: SearchPlan, at: { x: number; y: number }, ctx: SearchContext): { mask: GrayFrame | null; excluded: boolean } {
  const ex = ctx.exclude;
  if (!ex?.length) return { mask: plan.mask, excluded: false };
  const { width: w, height: h } = plan.template;
  const x0 = at.x - plan.ax;
  const y0 = at.y - plan.ay;
  const margin = ctx.excludeMargin ?? EXCLUDE_MARGIN;
  const touching = ex.filter((r) => mayTouch(r, x0, y0, w, h, margin));
  if (!touching.length) return { mask: plan.mask, excluded: false };
  const mask = intersect(plan.mask, rasterMask(w, h, x0, y0, null, touching, margin))!;
  const own = plan.mask ? coverage(plan.mask) : 1;
  return coverage(mask) < MIN_KEPT * own ? { mask: plan.mask, excluded: true } : { mask, excluded: true };
}

export function searchFrame(
  frame: GrayFrame,
  ref: Reference,
  predicted: { x: number; y: number },
  predictedAngle: number,
  startRadius: number,
  ctx: SearchContext,
): FrameMatch | null {
  let reach = false;
  let excluded = false;
  const attempt = (angle: number, around: { x: number; y: number }, radius: number): Attempt | null => {
    const tpl = templateAt(ref, angle, ctx.matcher);
    const plan = planSearch(frame, tpl, around, radius, ctx.minSize, reach);
    if (!plan) return null;
    const { mask, excluded: touched } = maskFor(plan, around, ctx);
    if (touched) excluded = true;
    return { plan, mask, peak: findPeak(ctx.matcher.match(frame, plan.window, plan.template, mask), ctx.exclusion), cropped: plan.template !== tpl.patch };
  };

  let radius = startRadius;
  let centre = attempt(predictedAngle, predicted, radius);
  if (!centre) return null;
  if (centre.peak.onBorder) {
    // Perhaps the frame edge cut the placements short: crop the template to reach the edge.
    reach = true;
    const reaching = attempt(predictedAngle, predicted, radius);
    if (reaching) centre = reaching;
    else reach = false;
  }
  for (let w = 0; w < WIDENINGS && centre.peak.onBorder; w++) {
    radius *= 2;
    const wider = attempt(predictedAngle, predicted, radius);
    if (!wider) break;
    centre = wider;
  }
  let found = landmark(centre, centre.plan.window.x + centre.peak.x, centre.plan.window.y + centre.peak.y);
  // Other objects are left out where the template sits; it sat at the prediction. Found elsewhere,
  // search again there, with them left out around the place found (twice at most).
  for (let k = 0; k < 2 && ctx.exclude?.length && !centre.peak.onBorder && Math.hypot(found.x - predicted.x - 0, found.y - predicted.y) > 0.75; k++) {
    const here = attempt(predictedAngle, found, TURN_RADIUS);
    if (!here || here.peak.onBorder) break;
    const moved = landmark(here, here.plan.window.x + here.peak.x, here.plan.window.y + here.peak.y);
    centre = here;
    const settled = Math.hypot(moved.x - found.x, moved.y - found.y) <= 0.75;
    found = moved;
    if (settled) break;
  }
  const base = { score: centre.peak.score, sideLobe: centre.peak.sideLobe, onBorder: centre.peak.onBorder, cropped: centre.cropped };
  if (!ref.source || centre.peak.onBorder || ctx.turnSearch === false) return { ...base, ...refined(frame, centre, centre.plan.template, centre.mask), angle: predictedAngle, excluded };

  // Steps k·TURN_STEP around the predicted angle; walk towards the better neighbour while it improves.
  const tried = new Map<number, Attempt | null>([[0, centre]]);
  const at = (k: number) => {
    if (!tried.has(k)) tried.set(k, attempt(predictedAngle + k * TURN_STEP, found, TURN_RADIUS));
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
  const replan = planSearch(frame, turned, found, TURN_RADIUS, ctx.minSize, reach);
  const same = replan && replan.template.width === chosen.plan.template.width && replan.template.height === chosen.plan.template.height;
  const [tpl, mask] = same ? [replan.template, maskFor(replan, found, ctx).mask] : [chosen.plan.template, chosen.mask];
  return { ...base, score: Math.max(base.score, chosen.peak.score), ...refined(frame, chosen, tpl, mask), angle, excluded };
}

function landmark(a: Attempt, ox: number, oy: number) {
  return { x: ox + a.plan.ax, y: oy + a.plan.ay };
}

/** The landmark at the placement refined to sub-pixel (falling back to the score-map fit). */
function refined(frame: GrayFrame, a: Attempt, template: GrayFrame, mask: GrayFrame | null): { x: number; y: number } {
  const ox = a.plan.window.x + a.peak.x;
  const oy = a.plan.window.y + a.peak.y;
  const r = a.peak.onBorder ? null : refinePlacement(frame, template, ox, oy, mask);
  return landmark(a, r?.x ?? ox, r?.y ?? oy);
}
