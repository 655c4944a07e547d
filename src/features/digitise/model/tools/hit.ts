import { LANDMARKS, type Landmark, type Mark } from "@shared/schemas/shots";
import type { CalDraft } from "../calibration-draft";
import { markAt } from "../tracks";
import { dist, toScreen, type Vec2, type View } from "../viewport";
import type { Handle } from "./pointer-tool";

/** Grab radius in screen px, whatever the zoom; a fingertip covers about 7 mm, so touch grabs from farther. */
export const HIT_RADIUS_PX = 10;
export const TOUCH_HIT_RADIUS_PX = 22;

export type ToolName = "mark" | "scaleBar" | "plane";

export interface HitScene {
  tool: ToolName;
  frame: number;
  view: View;
  marks: Partial<Record<Landmark, Mark[]>>;
  visible: Record<Landmark, boolean>;
  calibration: CalDraft | null;
}

export function handlePosition(scene: Pick<HitScene, "marks" | "calibration">, h: Handle): Vec2 | null {
  if (h.kind === "mark") {
    const m = markAt(scene.marks[h.landmark], h.frame);
    return m ? [m[1], m[2]] : null;
  }
  const c = scene.calibration;
  if (h.kind === "scaleBar") return c?.type === "scaleBar" ? c[h.end] : null;
  return c?.type === "plane" ? (c.points[h.index]?.image ?? null) : null;
}

/** Handles the active tool offers: marks on this frame for marking, calibration points for the calibration tools. */
export function handlesOf(scene: HitScene): Handle[] {
  const out: Handle[] = [];
  if (scene.tool === "mark") {
    for (const landmark of LANDMARKS) if (scene.visible[landmark] && markAt(scene.marks[landmark], scene.frame)) out.push({ kind: "mark", landmark, frame: scene.frame });
  } else if (scene.calibration?.type === "scaleBar" && scene.tool === "scaleBar") {
    for (const end of ["a", "b"] as const) if (scene.calibration[end]) out.push({ kind: "scaleBar", end });
  } else if (scene.calibration?.type === "plane" && scene.tool === "plane") {
    scene.calibration.points.forEach((_, index) => out.push({ kind: "plane", index }));
  }
  return out;
}

/** The nearest offered handle within the grab radius of a stage position, or null. */
export function hitTest(scene: HitScene, screen: Vec2, touch = false): Handle | null {
  let best: Handle | null = null;
  let bestD = touch ? TOUCH_HIT_RADIUS_PX : HIT_RADIUS_PX;
  for (const h of handlesOf(scene)) {
    const p = handlePosition(scene, h);
    if (!p) continue;
    const d = dist(toScreen(scene.view, p), screen);
    if (d <= bestD) {
      best = h;
      bestD = d;
    }
  }
  return best;
}
