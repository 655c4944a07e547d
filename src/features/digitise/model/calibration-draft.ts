import { validateCalibration } from "@shared/mechanics/calibration";
import { calibrationFrameProblem, engineCalibration, lengthToMm, mmToLength, PUCK_DIAMETER_MM, type ClipCalibration } from "@shared/schemas/shots";
import type { Vec2 } from "./viewport";

// A calibration while the analyst is still drawing it: a scale bar with one end, a plane with
// three points or a point whose world position is not typed in yet. Only a complete and valid
// draft is sent to the server; the rest stays on the page with a note saying what is missing.

export type LengthUnit = "mm" | "in";

export type CalDraft =
  | { type: "scaleBar"; a: Vec2 | null; b: Vec2 | null; length: number; unit: LengthUnit }
  | { type: "plane"; points: { image: Vec2; world: Vec2 | null }[] };

export const newScaleBar = (): CalDraft => ({ type: "scaleBar", a: null, b: null, length: PUCK_DIAMETER_MM, unit: "mm" });
export const newPlane = (): CalDraft => ({ type: "plane", points: [] });

export function draftFromClip(c: ClipCalibration | null): CalDraft | null {
  if (!c) return null;
  if (c.type === "scaleBar") {
    const unit = c.lengthUnit ?? "mm";
    return { type: "scaleBar", a: [...c.a], b: [...c.b], length: roundLength(mmToLength(c.lengthMm, unit)), unit };
  }
  return { type: "plane", points: c.points.map((p) => ({ image: [...p.image] as Vec2, world: [...p.world] as Vec2 })) };
}

const roundLength = (v: number) => Math.round(v * 1e6) / 1e6;

export type DraftCheck =
  | { state: "none"; calibration: null }
  | { state: "incomplete"; message: string }
  | { state: "invalid"; message: string }
  | { state: "ready"; calibration: ClipCalibration };

/** What the draft is worth: nothing set, not finished, refused (with the engine's words), or ready to save. */
export function checkDraft(d: CalDraft | null, frame: { width: number; height: number }): DraftCheck {
  if (!d) return { state: "none", calibration: null };
  let cal: ClipCalibration;
  if (d.type === "scaleBar") {
    if (!d.a || !d.b) return { state: "incomplete", message: d.a ? "Click the other end of the scale bar." : "Click one end of a known length, then the other." };
    if (!(d.length > 0)) return { state: "invalid", message: "The known length must be above 0." };
    cal = { type: "scaleBar", a: d.a, b: d.b, lengthMm: lengthToMm(d.length, d.unit), lengthUnit: d.unit };
  } else {
    if (d.points.length < 4) return { state: "incomplete", message: `Click ${4 - d.points.length} more point${d.points.length === 3 ? "" : "s"} of a known layout (at least 4).` };
    const missing = d.points.findIndex((p) => !p.world);
    if (missing >= 0) return { state: "incomplete", message: `Type the position in mm of point ${missing + 1} on the plane.` };
    cal = { type: "plane", points: d.points.map((p) => ({ image: p.image, world: p.world! })) };
  }
  const onFrame = calibrationFrameProblem(cal, frame);
  if (onFrame) return { state: "invalid", message: onFrame.message };
  const problem = validateCalibration(engineCalibration(cal));
  if (problem) return { state: "invalid", message: problem };
  return { state: "ready", calibration: cal };
}

/** mm per frame pixel of a ready scale bar (for the panel's read-out), else null. */
export function scaleOf(c: ClipCalibration | null): number | null {
  if (!c || c.type !== "scaleBar") return null;
  return c.lengthMm / Math.hypot(c.b[0] - c.a[0], c.b[1] - c.a[1]);
}
