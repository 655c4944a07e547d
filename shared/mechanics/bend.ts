import type { Vec2 } from "./homography";
import { hypot } from "./hypot";

// Stick bend from three landmarks on the shaft: top hand, bottom hand, blade heel.

/** Angle in degrees between top hand → bottom hand and bottom hand → blade heel (0° = straight). */
export function bendAngleDeg(top: Vec2, bottom: Vec2, heel: Vec2): number {
  return bendAngleXY(top[0], top[1], bottom[0], bottom[1], heel[0], heel[1]);
}

/** bendAngleDeg on plain coordinates (no arrays: the bend series runs it on every frame). */
export function bendAngleXY(tx: number, ty: number, bx: number, by: number, hx: number, hy: number): number {
  const ux = bx - tx;
  const uy = by - ty;
  const vx = hx - bx;
  const vy = hy - by;
  return (Math.atan2(Math.abs(ux * vy - uy * vx), ux * vx + uy * vy) * 180) / Math.PI;
}

export interface ChordGeometry {
  /** Distance of the bottom hand from the chord top hand → blade heel, mm. */
  deflectionMm: number;
  /** Along the chord from the top hand to the foot of the perpendicular, mm (negative = beyond the top hand). */
  aMm: number;
  /** Along the chord from the blade heel to the foot of the perpendicular, mm. */
  bMm: number;
}

export function chordGeometry(top: Vec2, bottom: Vec2, heel: Vec2): ChordGeometry {
  const cx = heel[0] - top[0];
  const cy = heel[1] - top[1];
  const L = hypot(cx, cy);
  const px = bottom[0] - top[0];
  const py = bottom[1] - top[1];
  const a = (px * cx + py * cy) / L;
  return { deflectionMm: Math.abs(px * cy - py * cx) / L, aMm: a, bMm: L - a };
}
