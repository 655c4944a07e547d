import type { Mark, ShotDocumentInput } from "../schemas/shot-document";
import type { Mat3 } from "./homography";
import { applyHomography } from "./homography";
import { storedEnergy } from "./stored-energy";
import { normalSource } from "./uncertainty";

// A made-up slap shot with known answers, seen side-on by a camera parallel to the plane of the
// shot (scale bar calibration) or obliquely (plane calibration): for tests, the benchmark and demo
// data. World mm, y up, ice at y = 0.

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
  /** Blade acceleration at puck strike, m/s² (default 0: the blade is at its fastest there). */
  bladeAccelMps2?: number;
  /** "plane": an oblique camera (the scale changes across the picture by about a third) and four known plane points. */
  calibration?: "scaleBar" | "plane";
  /**
   * The true instants of ice strike, puck strike and release lie this many frames after the marked
   * frames (each in −0.5 … 0.5: a camera samples the instant, the analyst marks the nearest frame).
   */
  eventPhase?: { iceStrike?: number; puckStrike?: number; release?: number };
}

export interface SyntheticTruth {
  exitSpeedMps: number;
  bladeSpeedAtStrikeMps: number;
  peakBendDeg: number;
  peakBendFrame: number;
  peakDeflectionMm: number;
  aMm: number;
  bMm: number;
  /** Stored energy at the peak-bend frame (null without a stick). */
  storedEnergyJ: number | null;
  /** True load and contact times, ms (the events' true instants, not their frames). */
  loadTimeMs: number;
  contactTimeMs: number;
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
  const phase = o.eventPhase ?? {};
  const ts = (puckStrike + (phase.puckStrike ?? 0)) / fps;
  const tr = (release + (phase.release ?? 0)) / fps;
  const ti = (iceStrike + (phase.iceStrike ?? 0)) / fps;

  // Blade midpoint: v = Vp / (1 + ((t − tp)/W)²) before strike, its peak tp = ts + d placed so that
  // v(ts) = V and dv/dt(ts) = A (d = 0: fastest at strike); 80 % of V, falling, after (impact loss).
  const W1 = 0.04;
  const W2 = 0.02;
  const A = o.bladeAccelMps2 ?? 0;
  if (!(Math.abs(A) * W1 < vBlade)) throw new RangeError(`bladeAccelMps2 must stay below ${vBlade / W1} m/s²`);
  const dPeak = A === 0 ? 0 : (vBlade - Math.sqrt(vBlade * vBlade - A * A * W1 * W1)) / A;
  const vPeak = vBlade * (1 + (dPeak / W1) ** 2);
  const bladeX = (t: number) =>
    (t <= ts ? vPeak * W1 * (Math.atan((t - ts - dPeak) / W1) + Math.atan(dPeak / W1)) : 0.8 * vBlade * W2 * Math.atan((t - ts) / W2)) * 1000;

  const a = SHAFT_MM * BOTTOM_AT;
  const b = SHAFT_MM - a;
  const defl = (t: number) => (t < ti || t > tr ? 0 : dMax * Math.sin((Math.PI * (t - ti)) / (tr - ti)) ** 2);

  const puckX0 = BLADE_HALF_MM + PUCK_RADIUS_MM;
  const acc = vExit / (tr - ts);
  const puckAlong = (t: number) => (t <= ts ? 0 : t <= tr ? 0.5 * acc * (t - ts) ** 2 : 0.5 * acc * (tr - ts) ** 2 + vExit * (t - tr)) * 1000;

  // World mm → image px: side-on (scale bar) or an oblique camera, a homography whose scale changes
  // by about a third across the shot.
  const origin = [100, 600];
  const oblique: Mat3 | null = o.calibration === "plane" ? [1 / s, 0, origin[0], 0, -1 / s, origin[1], 1 / 12000, 1 / 20000, 1] : null;
  const toPx = (x: number, y: number): [number, number] => {
    const [px, py] = oblique ? applyHomography(oblique, x, y) : [origin[0] + x / s, origin[1] - y / s];
    return [px + noisePx * normal(), py + noisePx * normal()];
  };
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

  // The truth a frame-by-frame measurement can reach: the largest bend on a captured frame.
  let peakBendFrame = Math.round((iceStrike + release) / 2);
  for (let f = iceStrike; f <= release; f++) if (defl(f / fps) > defl(peakBendFrame / fps)) peakBendFrame = f;
  const tp = peakBendFrame / fps;
  const dp = defl(tp);
  const stick = o.flex === null ? null : { flex: o.flex ?? 85, benchSpanMm: 1000 };
  const calibration: ShotDocumentInput["calibration"] = oblique
    ? // Four known points of the plane, a 3 m × 1.2 m rectangle, digitised with the same noise.
      { type: "plane", points: ([[-1500, 0], [1500, 0], [1500, 1200], [-1500, 1200]] as const).map(([x, y]) => ({ image: toPx(x, y), world: [x, y] as [number, number] })) }
    : // The scale bar's ends are digitised too, with the same noise.
      { type: "scaleBar", a: toPx(0, 0), b: toPx(40 * s, 0), lengthMm: 40 * s };
  const doc: ShotDocumentInput = {
    captureFps: fps,
    calibration,
    pixelErrorPx: noisePx > 0 ? noisePx : 0.5,
    tracks,
    events: { iceStrike, puckStrike, peakBend: peakBendFrame, release },
    stick,
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
      storedEnergyJ: stick ? storedEnergy(stick.flex, stick.benchSpanMm, { deflectionMm: dp, aMm: a, bMm: b })!.valueJ : null,
      loadTimeMs: (ts - ti) * 1000,
      contactTimeMs: (tr - ts) * 1000,
    },
  };
}
