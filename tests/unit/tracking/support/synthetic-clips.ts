// Clips with a known trajectory, rendered by the system ffmpeg from lavfi sources. The truth of
// every test that uses them is the generator's own formula: each shape's position is written once
// as an ffmpeg expression and once in TypeScript, both as functions of the frame time t = n / fps
// (ffmpeg's own T/t); clips.test.ts checks on noise-free renders that the two agree.
//
// A disc is drawn sub-pixel exactly: geq paints it into a small sprite at the fractional part of
// its position and overlay places the sprite at the whole part (geq over a whole frame is ~20×
// slower). Its edge is anti-aliased by pixel coverage, clip(r + 0.5 − distance, 0, 1). A bar is a
// drawbox turned by the rotate filter (bilinear) about the centre of its canvas.
import { execa } from "execa";
import type { FrameSource, GrayFrame } from "../../../../shared/tracking/types";

export interface Point {
  x: number;
  y: number;
}

export interface ClipSpec {
  name: string;
  width: number;
  height: number;
  fps: number;
  frames: number;
  /** ffmpeg filter graph producing the clip on its last output. */
  graph: string;
  truth(n: number): Point;
}

/** A trajectory as a TypeScript function of time and the same formula as an ffmpeg expression of `v` (T or t). */
export interface Path {
  at(t: number): Point;
  expr(v: string): { x: string; y: string };
}

const BG_COLOUR = "0x3c3c3c";
const FG_COLOUR = "0xc8c8c8";
/** Added to the background's luma inside a disc (full coverage). */
const DISC_CONTRAST = 140;
const SPRITE = 32;

export interface ClipOptions {
  width?: number;
  height?: number;
  fps: number;
  frames: number;
  /** ffmpeg noise filter strength (alls), temporal; 0 for none. */
  noise?: number;
  radius?: number;
  /** Radius growth in px per second (a puck coming towards the camera). */
  growth?: number;
}

// Everything is drawn in yuv444p, where color, geq, drawbox, rotate and overlay agree on levels
// and no plane is subsampled; the clip is turned to gray only at the end.
const canvas = (w: number, h: number, fps: number) => `color=c=${BG_COLOUR}:s=${w}x${h}:r=${fps},format=yuv444p`;
const finish = (o: ClipOptions) => `format=gray${o.noise ? `,noise=alls=${o.noise}:allf=t` : ""}`;

function spec(name: string, o: ClipOptions, graph: string, truth: (n: number) => Point): ClipSpec {
  return { name, width: o.width ?? 320, height: o.height ?? 240, fps: o.fps, frames: o.frames, graph, truth };
}

/** A disc of the given radius (default 10 px) moving along `path`; `extra` filters run before the noise. */
export function discClip(name: string, path: Path, o: ClipOptions, extra = ""): ClipSpec {
  const r0 = o.radius ?? 10;
  const growth = o.growth ?? 0;
  const r = growth ? `(${r0}+${growth}*T)` : String(r0);
  const size = Math.max(SPRITE, 2 * Math.ceil(r0 + growth * (o.frames / o.fps) + 3));
  const half = size / 2;
  const g = path.expr("T");
  const p = path.expr("t");
  const cover = `clip(${r}+0.5-hypot(X+0.5-${half}-(${g.x}-floor(${g.x})),Y+0.5-${half}-(${g.y}-floor(${g.y}))),0,1)`;
  const disc = `${canvas(size, size, o.fps)},geq=lum='p(X,Y)+${DISC_CONTRAST}*${cover}':cb='p(X,Y)':cr='p(X,Y)'`;
  const graph =
    `${canvas(o.width ?? 320, o.height ?? 240, o.fps)}[bg];${disc}[sp];` +
    `[bg][sp]overlay=x='floor(${p.x})-${half}':y='floor(${p.y})-${half}':format=yuv444:eval=frame${extra ? `,${extra}` : ""},${finish(o)}`;
  return spec(name, o, graph, (n) => path.at(n * (1 / o.fps)));
}

export interface BarOptions extends ClipOptions {
  /** Whole pixels: the bar canvas is placed without resampling. */
  pivot: Point;
  length: number;
  thickness: number;
  /** Angle (rad; y is down, so positive turns clockwise on screen) = angle0 + omega·t. */
  angle0: number;
  omega: number;
  /** Distance from the pivot of the tracked point on the bar's axis. */
  trackAt: number;
}

/**
 * A bar turning about one end, like a shaft about the hands; the truth is a point on its axis near
 * the free end. The bar is a box from the centre of a square canvas to its right, turned about
 * that centre by ffmpeg's rotate filter (bilinear), then placed with the centre on the pivot.
 */
export function barClip(name: string, o: BarOptions): ClipSpec {
  const size = 2 * (o.length + 8);
  const c = size / 2;
  const bar =
    `${canvas(size, size, o.fps)},drawbox=x=${c}:y=${c - o.thickness / 2}:w=${o.length}:h=${o.thickness}:color=${FG_COLOUR}:t=fill,` +
    `rotate=a='${o.angle0}+${o.omega}*t':c=${BG_COLOUR}`;
  const graph = `${canvas(o.width ?? 320, o.height ?? 240, o.fps)}[bg];${bar}[sp];[bg][sp]overlay=x=${o.pivot.x - c}:y=${o.pivot.y - c}:format=yuv444,${finish(o)}`;
  const angle = (n: number) => o.angle0 + o.omega * (n * (1 / o.fps));
  return Object.assign(
    spec(name, o, graph, (n) => ({ x: o.pivot.x + o.trackAt * Math.cos(angle(n)), y: o.pivot.y + o.trackAt * Math.sin(angle(n)) })),
    { angle },
  );
}

/** x0 + vx·t + ½·ax·t², same for y (pixels, seconds). */
export function ballistic(x0: number, y0: number, vx: number, vy: number, ax = 0, ay = 0): Path {
  return {
    at: (t) => ({ x: x0 + vx * t + 0.5 * ax * t * t, y: y0 + vy * t + 0.5 * ay * t * t }),
    expr: (v) => ({ x: `(${x0}+${vx}*${v}+${0.5 * ax}*${v}*${v})`, y: `(${y0}+${vy}*${v}+${0.5 * ay}*${v}*${v})` }),
  };
}

/** Round a centre (cx, cy) at `radius` px, angle phase0 + omega·t. */
export function circular(cx: number, cy: number, radius: number, omega: number, phase0 = 0): Path {
  return {
    at: (t) => ({ x: cx + radius * Math.cos(phase0 + omega * t), y: cy + radius * Math.sin(phase0 + omega * t) }),
    expr: (v) => ({ x: `(${cx}+${radius}*cos(${phase0}+${omega}*${v}))`, y: `(${cy}+${radius}*sin(${phase0}+${omega}*${v}))` }),
  };
}

/** A dark box (like a blade passing in front) over `at`, on frames first … last inclusive. */
export function occluder(o: { fps: number }, at: Point, size: number, first: number, last: number): string {
  const x = Math.round(at.x - size / 2);
  const y = Math.round(at.y - size / 2);
  const from = (first - 0.5) / o.fps;
  const to = (last + 0.5) / o.fps;
  return `drawbox=x=${x}:y=${y}:w=${size}:h=${size}:color=0x1e1e1e:t=fill:enable='between(t,${from},${to})'`;
}

/** Every frame of the clip as 8-bit gray, decoded by ffmpeg straight to a pipe. */
export async function renderGray(spec: ClipSpec): Promise<GrayFrame[]> {
  const { stdout } = await execa(
    "ffmpeg",
    ["-nostdin", "-v", "error", "-filter_complex", spec.graph, "-frames:v", String(spec.frames), "-f", "rawvideo", "-pix_fmt", "gray", "pipe:1"],
    { encoding: "buffer", maxBuffer: 1 << 30 },
  );
  const bytes = spec.width * spec.height;
  if (stdout.length !== bytes * spec.frames) throw new Error(`${spec.name}: ffmpeg gave ${stdout.length} bytes, expected ${bytes * spec.frames}`);
  const frames: GrayFrame[] = [];
  for (let i = 0; i < spec.frames; i++) frames.push({ width: spec.width, height: spec.height, data: new Uint8Array(stdout.buffer, stdout.byteOffset + i * bytes, bytes) });
  return frames;
}

/** Frames held in memory, served asynchronously like a decoder would. */
export function memorySource(frames: GrayFrame[]): FrameSource {
  return { length: frames.length, frame: async (i) => frames[i] };
}

/** Centre of what is brighter than the background level `bg` inside the box, in pixel-edge coordinates. */
export function centroid(f: GrayFrame, bg: number, box?: { x0: number; y0: number; x1: number; y1: number }): Point {
  const { x0 = 0, y0 = 0, x1 = f.width, y1 = f.height } = box ?? {};
  let sw = 0, sx = 0, sy = 0;
  for (let y = y0; y < y1; y++)
    for (let x = x0; x < x1; x++) {
      const w = Math.max(0, f.data[y * f.width + x] - bg);
      sw += w; sx += w * (x + 0.5); sy += w * (y + 0.5);
    }
  return { x: sx / sw, y: sy / sw };
}
