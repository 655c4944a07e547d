import type { Mark, ShotDocumentInput } from "../schemas/shot-document";
import { normalSource } from "./uncertainty";

// A made-up slap shot with known answers, seen side-on by a camera parallel to the plane of the
// shot (scale bar calibration): for tests, the benchmark and demo data. World mm, y up, ice at y = 0.

export interface SyntheticShotOptions {
  captureFps?: number;
  /** Marks per track. */
  frames?: number;
  /** Gaussian noise added to every digitised coordinate (px); 0 = exact marks. */
  noisePx?: number;
  seed?: string;
  exitSpeedMps?: number;
  bladeSpeedMps?: number;
  /** Largest sideways deflection of the bottom hand from the chord, mm. */
  peakDeflectionMm?: number;
  mmPerPx?: number;
  flex?: number | null;
}

export interface SyntheticTruth {
  exitSpeedMps: number;
  bladeSpeedAtStrikeMps: number;
  peakBendDeg: number;
  peakBendFrame: number;
  peakDeflectionMm: number;
  aMm: number;
  bMm: number;
}

const SHAFT_MM = 1300;
const SHAFT_ANGLE = (50 * Math.PI) / 180;
/** Bottom hand position along the shaft from the top hand. */
const BOTTOM_AT = 0.45;
const BLADE_HALF_MM = 140;
const PUCK_RADIUS_MM = 38.1;
const LAUNCH = (8 * Math.PI) / 180;

export function syntheticShot(o: SyntheticShotOptions = {}): { doc: ShotDocumentInput; truth: SyntheticTruth } {
  const fps = o.captureFps ?? 3200;
  const n = o.frames ?? 400;
  const vExit = o.exitSpeedMps ?? 30;
  const vBlade = o.bladeSpeedMps ?? 22;
  const dMax = o.peakDeflectionMm ?? 40;
  const s = o.mmPerPx ?? 1.905;
  const noisePx = o.noisePx ?? 0;
  const normal = normalSource(o.seed ?? "synthetic");

  // Events: 25 ms of loading, 30 ms of contact, placed so at least 40 flight frames follow.
  const contact = Math.max(2, Math.round(0.03 * fps));
  const load = Math.max(1, Math.round(0.025 * fps));
  const release = Math.max(load + contact + 2, n - Math.max(40, Math.round(n * 0.3)));
  const puckStrike = release - contact;
  const iceStrike = puckStrike - load;
  const ts = puckStrike / fps;
  const tr = release / fps;
  const ti = iceStrike / fps;

  // Blade midpoint: v = V / (1 + ((t − ts)/W)²) before strike; 80 % of that shape after (impact loss).
  const W1 = 0.04;
  const W2 = 0.02;
  const bladeX = (t: number) => (t <= ts ? vBlade * W1 * Math.atan((t - ts) / W1) : 0.8 * vBlade * W2 * Math.atan((t - ts) / W2)) * 1000;

  const a = SHAFT_MM * BOTTOM_AT;
  const b = SHAFT_MM - a;
  const defl = (t: number) => (t < ti || t > tr ? 0 : dMax * Math.sin((Math.PI * (t - ti)) / (tr - ti)) ** 2);

  const puckX0 = BLADE_HALF_MM + PUCK_RADIUS_MM;
  const acc = vExit / (tr - ts);
  const puckAlong = (t: number) => (t <= ts ? 0 : t <= tr ? 0.5 * acc * (t - ts) ** 2 : 0.5 * acc * (tr - ts) ** 2 + vExit * (t - tr)) * 1000;

  const origin = [100, 600];
  const toPx = (x: number, y: number): [number, number] => [
    origin[0] + x / s + noisePx * normal(),
    origin[1] - y / s + noisePx * normal(),
  ];
  const tracks: Record<"puck" | "bladeHeel" | "bladeToe" | "bottomHand" | "topHand", Mark[]> = {
    puck: [],
    bladeHeel: [],
    bladeToe: [],
    bottomHand: [],
    topHand: [],
  };
  const ux = -Math.cos(SHAFT_ANGLE);
  const uy = Math.sin(SHAFT_ANGLE);
  for (let f = 0; f < n; f++) {
    const t = f / fps;
    const mx = bladeX(t);
    const heel: [number, number] = [mx - BLADE_HALF_MM, 0];
    const topW: [number, number] = [heel[0] + ux * SHAFT_MM, heel[1] + uy * SHAFT_MM];
    const d = defl(t);
    const bottomW: [number, number] = [topW[0] - ux * a + uy * d, topW[1] - uy * a - ux * d];
    const along = puckAlong(t);
    tracks.puck.push([f, ...toPx(puckX0 + along * Math.cos(LAUNCH), PUCK_RADIUS_MM + along * Math.sin(LAUNCH))]);
    tracks.bladeHeel.push([f, ...toPx(...heel)]);
    tracks.bladeToe.push([f, ...toPx(mx + BLADE_HALF_MM, 0)]);
    tracks.bottomHand.push([f, ...toPx(...bottomW)]);
    tracks.topHand.push([f, ...toPx(...topW)]);
  }

  const peakBendFrame = Math.round((iceStrike + release) / 2);
  const tp = peakBendFrame / fps;
  const dp = defl(tp);
  const doc: ShotDocumentInput = {
    captureFps: fps,
    // The scale bar's ends are digitised too, with the same noise.
    calibration: { type: "scaleBar", a: toPx(0, 0), b: toPx(40 * s, 0), lengthMm: 40 * s },
    pixelErrorPx: noisePx > 0 ? noisePx : 0.5,
    tracks,
    events: { iceStrike, puckStrike, peakBend: peakBendFrame, release },
    stick: o.flex === null ? null : { flex: o.flex ?? 85, benchSpanMm: 1000 },
    frameCount: n,
  };
  return {
    doc,
    truth: {
      exitSpeedMps: vExit,
      bladeSpeedAtStrikeMps: vBlade,
      peakBendDeg: ((Math.atan(dp / a) + Math.atan(dp / b)) * 180) / Math.PI,
      peakBendFrame,
      peakDeflectionMm: dp,
      aMm: a,
      bMm: b,
    },
  };
}
