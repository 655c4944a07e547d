// Playback speed as a fraction of real time. The default shows about 30 frames a second whatever
// the capture rate (3,200 fps plays at 1/107 real time, 240 fps at 1/8), so a clip never crawls or
// skips at first; the person can still pick another speed (decision 136).

/** Frames a second a person follows comfortably: the default speed shows about this many. */
export const DISPLAY_FPS = 30;
/** Above this many frames a second the display skips frames. */
export const MAX_SHOWN_FPS = 60;
const STANDARD = [1 / 1000, 1 / 400, 1 / 200, 1 / 100, 1 / 50, 1 / 20, 1 / 10, 1 / 4, 1] as const;

/** About 30 shown frames a second, never faster than real time; a usual speed within 2 % is that speed. */
export function defaultFraction(captureFps: number): number {
  const d = Math.min(1, DISPLAY_FPS / captureFps);
  return STANDARD.find((f) => Math.abs(f / d - 1) < 0.02) ?? d;
}

/** The speeds to offer: the usual ones and this clip's default, slowest first. */
export function fractionChoices(captureFps: number): number[] {
  const d = defaultFraction(captureFps);
  return STANDARD.includes(d as (typeof STANDARD)[number]) ? [...STANDARD] : [...STANDARD, d].sort((a, b) => a - b);
}

export const fractionLabel = (f: number) => (f >= 1 ? "real time" : `1/${Math.round(1 / f).toLocaleString("en")} real time`);

/** Frames shown per second of the viewer's time. */
export const shownFps = (captureFps: number, fraction: number) => captureFps * fraction;

/** "32 frames/s", "0.8 frames/s", "60 frames/s (skipping)". */
export function shownText(captureFps: number, fraction: number): string {
  const raw = shownFps(captureFps, fraction);
  const shown = Math.min(MAX_SHOWN_FPS, raw);
  return `${shown < 10 ? shown.toFixed(1) : Math.round(shown)} frames/s${raw > MAX_SHOWN_FPS ? " (skipping)" : ""}`;
}
