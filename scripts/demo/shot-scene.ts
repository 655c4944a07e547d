// A synthetic slap shot seen side-on, for demo data, end-to-end fixtures and the Digitise
// benchmark. Every position is analytic, so the truth of every landmark on every frame is known:
//
//   blade: on the way down until ice strike, along the ice through contact, then lifting away;
//          horizontal speed a bell peaking at puck strike, rising during contact as the shaft
//          unloads, fading after release
//   shaft: a chord from the blade heel at a slowly turning angle, bent under load between ice
//          strike and release like a simply supported beam loaded at the bottom hand
//   puck:  at rest, then carried by the toe during contact, then a straight flight
//
// World units are mm with y up and the ice at y = 0; the camera's optical axis is square to the
// plane of the shot, so image = world / scale (a scale bar is exact). Made-up scene, no real data.
import type { Landmark, Mark } from "../../shared/schemas/shot-document";
import { PUCK_DIAMETER_MM } from "../../shared/schemas/shot-document";

export interface SceneOptions {
  captureFps?: number;
  frames?: number;
  width?: number;
  height?: number;
  /** mm per image pixel. */
  mmPerPx?: number;
  exitSpeedMps?: number;
  /** Blade speed at puck strike. */
  bladeSpeedMps?: number;
  /** Largest sideways deflection of the bottom hand from the chord. */
  peakDeflectionMm?: number;
  /** Frame of ice strike (the first frame is 1). */
  iceStrikeFrame?: number;
  /** The blade's downward speed as it meets the ice, m/s (default 0: it settles onto the ice). */
  bladeDropMps?: number;
  loadMs?: number;
  contactMs?: number;
  /** Shown in the corner of each frame. */
  caption?: string;
  /** Glove colour. */
  gloves?: string;
  /**
   * A light print on the puck's rim, turning with the puck at this many revolutions per second
   * (0: plain black puck). Seen side-on it slides across the rim and narrows towards the ends.
   */
  puckSpinRps?: number;
}

export interface SceneTruth {
  captureFps: number;
  frameCount: number;
  width: number;
  height: number;
  mmPerPx: number;
  /** Every landmark on every frame where it is inside the picture, in image px (continuous: pixel i spans [i, i+1)). */
  tracks: Record<Landmark, Mark[]>;
  events: { iceStrike: number; puckStrike: number; peakBend: number; release: number };
  /** The puck's side view is exactly one diameter long: its two ends on frame 1. */
  scaleBar: { type: "scaleBar"; a: [number, number]; b: [number, number]; lengthMm: number };
  exitSpeedMps: number;
  bladeSpeedAtStrikeMps: number;
  peakBendDeg: number;
}

type V = [number, number];

const BLADE_MM = 290;
const BLADE_H_MM = 55;
const PUCK_H_MM = 25.4;
const R = PUCK_DIAMETER_MM / 2;
/** Heel → top hand along the chord, and on to the butt end. */
const CHORD_MM = 1280;
const SHAFT_MM = 1400;
/** Bottom hand along the chord, from the top hand. */
const BOTTOM_FROM_TOP = 0.42;
const LAUNCH_RAD = (5 * Math.PI) / 180;

export function shotScene(o: SceneOptions = {}) {
  const fps = o.captureFps ?? 3200;
  const n = o.frames ?? 300;
  const W = o.width ?? 1280;
  const H = o.height ?? 720;
  const s = o.mmPerPx ?? 2.25;
  const vExit = (o.exitSpeedMps ?? 30) * 1000; // mm/s
  const v1 = (o.bladeSpeedMps ?? 20) * 1000;
  const dMax = o.peakDeflectionMm ?? 42;
  const iceF = o.iceStrikeFrame ?? 40;
  const puckF = iceF + Math.round(((o.loadMs ?? 22) * fps) / 1000);
  const relF = puckF + Math.round(((o.contactMs ?? 27) * fps) / 1000);
  const t = (f: number) => (f - 1) / fps;
  const ti = t(iceF);
  const ts = t(puckF);
  const tr = t(relF);
  const tEnd = t(n);

  // Blade midpoint along x.
  const Wb = 0.028;
  const acc = (vExit - v1) / (tr - ts);
  const tau = 0.012;
  const xContact = (dt: number) => v1 * dt + 0.5 * acc * dt * dt;
  const bladeX = (tt: number) => {
    if (tt <= ts) return v1 * Wb * Math.atan((tt - ts) / Wb);
    if (tt <= tr) return xContact(tt - ts);
    return xContact(tr - ts) + vExit * tau * (1 - Math.exp(-(tt - tr) / tau));
  };
  // From 95 mm up down to the ice, meeting it at `drop` mm/s (a kink) or settling (drop 0).
  const drop = (o.bladeDropMps ?? 0) * 1000;
  const settle = Math.max(0, 95 - drop * ti);
  const bladeY = (tt: number) =>
    tt < ti ? drop * (ti - tt) + settle * ((ti - tt) / Math.max(ti, 1e-9)) ** 2 : tt <= tr ? 0 : 140 * ((tt - tr) / (tEnd - tr)) ** 2;
  // Shaft chord angle from +x: leaning back, turning upright through the shot.
  const phi = (tt: number) => {
    const u = Math.min(1, Math.max(0, tt / tEnd));
    return ((118 - 26 * u * u * (3 - 2 * u)) * Math.PI) / 180;
  };
  const defl = (tt: number) => (tt < ti || tt > tr ? 0 : dMax * Math.sin((Math.PI * (tt - ti)) / (tr - ti)) ** 2);

  const puckRestX = BLADE_MM / 2 + R; // the toe meets the puck at strike
  const puck = (tt: number): V => {
    if (tt <= ts) return [puckRestX, PUCK_H_MM / 2];
    if (tt <= tr) return [bladeX(tt) + BLADE_MM / 2 + R, PUCK_H_MM / 2];
    const x0 = bladeX(tr) + BLADE_MM / 2 + R;
    const d = vExit * (tt - tr);
    return [x0 + d * Math.cos(LAUNCH_RAD), PUCK_H_MM / 2 + d * Math.sin(LAUNCH_RAD)];
  };

  /** Stick pose at a time, world mm: heel, toe, hands, butt, and the bent shaft as a polyline. */
  const pose = (tt: number) => {
    const mx = bladeX(tt);
    const by = bladeY(tt);
    const heel: V = [mx - BLADE_MM / 2, by];
    const toe: V = [mx + BLADE_MM / 2, by];
    const a = phi(tt);
    const u: V = [Math.cos(a), Math.sin(a)];
    const nrm: V = [-Math.sin(a), Math.cos(a)]; // bows back, away from the shot
    const d = defl(tt);
    // Simply supported heel…top hand, point load at the bottom hand (AISC case 8 shape), scaled to d.
    const L = CHORD_MM;
    const aL = L * (1 - BOTTOM_FROM_TOP); // bottom hand from the heel
    const bL = L - aL;
    const shape = (x: number) => (x <= aL ? bL * x * (L * L - bL * bL - x * x) : aL * (L - x) * (L * L - aL * aL - (L - x) * (L - x)));
    const k = d / (shape(aL) || 1);
    const at = (x: number): V => [heel[0] + u[0] * x + nrm[0] * k * shape(x), heel[1] + u[1] * x + nrm[1] * k * shape(x)];
    const shaft: V[] = [];
    for (let i = 0; i <= 40; i++) shaft.push(at((L * i) / 40));
    const top = at(L);
    // Past the top hand the shaft runs straight on along its slope there.
    const slope = -k * aL * (L * L - aL * aL) + 0; // d/dx of the x ≥ aL branch at x = L
    const dir: V = [u[0] + nrm[0] * slope, u[1] + nrm[1] * slope];
    const dl = Math.hypot(dir[0], dir[1]);
    const butt: V = [top[0] + (dir[0] / dl) * (SHAFT_MM - L), top[1] + (dir[1] / dl) * (SHAFT_MM - L)];
    shaft.push(butt);
    return { heel, toe, top, bottom: at(aL), butt, shaft, blade: { mx, by } };
  };

  // Camera: fit the stick and puck up to a little after release, the ice near the bottom.
  let minX = Infinity;
  for (let f = 1; f <= Math.min(n, relF + 10); f++) {
    const p = pose(t(f));
    minX = Math.min(minX, p.top[0], p.butt[0], p.heel[0], p.bottom[0]);
  }
  const ox = 36 - minX / s;
  const oy = H - 70;
  const px = (p: V): [number, number] => [ox + p[0] / s, oy - p[1] / s];
  const inside = (q: [number, number]) => q[0] >= 0 && q[1] >= 0 && q[0] <= W && q[1] <= H;

  const tracks: Record<Landmark, Mark[]> = { puck: [], bladeHeel: [], bladeToe: [], bottomHand: [], topHand: [], buttEnd: [] };
  for (let f = 1; f <= n; f++) {
    const tt = t(f);
    const p = pose(tt);
    const add = (k: Landmark, w: V) => {
      const q = px(w);
      if (inside(q)) tracks[k].push([f, q[0], q[1]]);
    };
    add("puck", puck(tt));
    add("bladeHeel", p.heel);
    add("bladeToe", p.toe);
    add("bottomHand", p.bottom);
    add("topHand", p.top);
    add("buttEnd", p.butt);
  }

  const peakF = Math.round((iceF + relF) / 2);
  const pk = pose(t(peakF));
  const v1v: V = [pk.bottom[0] - pk.top[0], pk.bottom[1] - pk.top[1]];
  const v2v: V = [pk.heel[0] - pk.bottom[0], pk.heel[1] - pk.bottom[1]];
  const cos = (v1v[0] * v2v[0] + v1v[1] * v2v[1]) / (Math.hypot(...v1v) * Math.hypot(...v2v));
  const p0 = px(puck(0));
  const truth: SceneTruth = {
    captureFps: fps,
    frameCount: n,
    width: W,
    height: H,
    mmPerPx: s,
    tracks,
    events: { iceStrike: iceF, puckStrike: puckF, peakBend: peakF, release: relF },
    scaleBar: { type: "scaleBar", a: [p0[0] - R / s, p0[1]], b: [p0[0] + R / s, p0[1]], lengthMm: PUCK_DIAMETER_MM },
    exitSpeedMps: vExit / 1000,
    bladeSpeedAtStrikeMps: v1 / 1000,
    peakBendDeg: (Math.acos(Math.min(1, cos)) * 180) / Math.PI,
  };

  const gloves = o.gloves ?? "#2a8fb0";
  const scratches = scratchField(W, H, oy);
  const head = `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`;
  /** What does not move: glass, boards, ice and its marks, the camera caption. */
  const background = (): string => `${head}
<defs><linearGradient id="glass" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#8796a3"/><stop offset="1" stop-color="#b7c3cc"/></linearGradient>
<linearGradient id="ice" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#dfe8ee"/><stop offset="1" stop-color="#f3f7f9"/></linearGradient></defs>
<rect width="${W}" height="${H}" fill="url(#ice)"/>
<rect width="${W}" height="${(oy * 0.42).toFixed(1)}" fill="url(#glass)"/>
<rect y="${(oy * 0.42).toFixed(1)}" width="${W}" height="${(oy * 0.2).toFixed(1)}" fill="#f4f4ef"/>
<rect y="${(oy * 0.58).toFixed(1)}" width="${W}" height="${(oy * 0.04).toFixed(1)}" fill="#d8b13a"/>
<rect x="${(W * 0.62).toFixed(1)}" y="${(oy * 0.62).toFixed(1)}" width="26" height="${(H - oy * 0.62).toFixed(1)}" fill="#3e6fb0" opacity="0.22"/>
${scratches}
<line x1="0" y1="${oy + 0.5}" x2="${W}" y2="${oy + 0.5}" stroke="#c9d4db" stroke-width="1"/>
<text x="${W - 14}" y="${H - 14}" text-anchor="end" font-family="monospace" font-size="15" fill="#51606b">${escapeXml(o.caption ?? "LF demo camera")} · ${fps} fps</text>
</svg>`;
  /** What moves, on a transparent ground: stick, gloves, puck. */
  const foreground = (f: number): string => {
    const tt = t(f);
    const p = pose(tt);
    const q = px(puck(tt));
    const shaft = p.shaft.map(px).map(([x, y]) => `${x.toFixed(2)},${y.toFixed(2)}`).join(" ");
    const heel = px(p.heel);
    const toe = px(p.toe);
    const bladeH = BLADE_H_MM / s;
    const glove = (w: V, rot: number) => {
      const [x, y] = px(w);
      return `<g transform="translate(${x.toFixed(2)} ${y.toFixed(2)}) rotate(${rot.toFixed(1)})"><rect x="-26" y="-21" width="52" height="42" rx="12" fill="${gloves}"/><rect x="-26" y="11" width="52" height="10" rx="4" fill="#e9f1f2"/></g>`;
    };
    const rot = -(phi(tt) * 180) / Math.PI + 90;
    const puckW = PUCK_DIAMETER_MM / s;
    const puckH = PUCK_H_MM / s;
    return `${head}
<polyline points="${shaft}" fill="none" stroke="#4a5560" stroke-width="12" stroke-linecap="round" stroke-linejoin="round"/>
<polyline points="${shaft}" fill="none" stroke="#7f8c96" stroke-width="3" stroke-linecap="round" stroke-linejoin="round" transform="translate(-2 -1)"/>
<path d="M ${heel[0].toFixed(2)} ${heel[1].toFixed(2)} L ${toe[0].toFixed(2)} ${toe[1].toFixed(2)} L ${(toe[0] - 4).toFixed(2)} ${(toe[1] - bladeH).toFixed(2)} L ${(heel[0] + 10).toFixed(2)} ${(heel[1] - bladeH * 0.7).toFixed(2)} Z" fill="#3b4148"/>
<rect x="${(heel[0] + 24).toFixed(2)}" y="${(heel[1] - bladeH * 0.72).toFixed(2)}" width="${((toe[0] - heel[0]) * 0.55).toFixed(2)}" height="${(bladeH * 0.42).toFixed(2)}" fill="#f2f2ec" opacity="0.9"/>
${glove(p.top, rot)}${glove(p.bottom, rot)}
<rect x="${(q[0] - puckW / 2).toFixed(3)}" y="${(q[1] - puckH / 2).toFixed(3)}" width="${puckW.toFixed(3)}" height="${puckH.toFixed(3)}" rx="${(puckH * 0.28).toFixed(2)}" fill="#050505"/>
${puckPrint(q, puckW, puckH, tt)}</svg>`;
  };
  /** The spinning print: a band on the rim's near half at angle 2π·rps·t, drawn where it faces the camera. */
  const puckPrint = (q: [number, number], puckW: number, puckH: number, tt: number): string => {
    const rps = o.puckSpinRps ?? 0;
    if (!rps) return "";
    const out: string[] = [];
    for (const offset of [0, Math.PI]) {
      // Still until puck strike; spinning from then on (the blade sets it turning).
      const a = 2 * Math.PI * rps * Math.max(0, tt - ts) + offset;
      const facing = Math.cos(a);
      if (facing <= 0.15) continue;
      const cx = q[0] + (puckW / 2) * Math.sin(a) * 0.92;
      const w = Math.max(1, 0.35 * puckW * facing);
      out.push(`<rect x="${(cx - w / 2).toFixed(3)}" y="${(q[1] - puckH * 0.3).toFixed(3)}" width="${w.toFixed(3)}" height="${(puckH * 0.6).toFixed(3)}" fill="#d9d2c0"/>`);
    }
    return out.join("");
  };
  /** One whole frame as a single SVG (slower to raster than background + foreground). */
  const svg = (f: number) => background().replace("</svg>", foreground(f).slice(head.length));
  return { truth, svg, background, foreground };
}

function escapeXml(s: string) {
  return s.replace(/[<>&"]/g, (c) => ({ "<": "&lt;", ">": "&gt;", "&": "&amp;", '"': "&quot;" })[c]!);
}

/** Faint skate marks on the ice, the same on every frame (a fixed, made-up pattern). */
function scratchField(W: number, H: number, iceY: number): string {
  let seed = 7;
  const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
  const out: string[] = [];
  for (let i = 0; i < 40; i++) {
    const x = rnd() * W;
    const y = iceY - 120 + rnd() * (H - iceY + 120);
    const len = 40 + rnd() * 160;
    out.push(`<line x1="${x.toFixed(1)}" y1="${y.toFixed(1)}" x2="${(x + len).toFixed(1)}" y2="${(y + (rnd() - 0.5) * 10).toFixed(1)}" stroke="#b9c7d1" stroke-width="1" opacity="0.5"/>`);
  }
  return out.join("");
}
