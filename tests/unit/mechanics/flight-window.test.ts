// The puck exit-speed fit covers a stretch of flight defined in time (the first 40 ms after
// release, or until the puck leaves the frame), not a fixed count of marks. Source: syntheticShot
// [calc], a straight flight at a known speed; the error pattern below is the one a tracker leaves
// while the blade is still beside the puck (a growing lag over the first ~3 ms of flight).
import { describe, expect, it } from "vitest";
import { computeShot, syntheticShot, type Mark } from "../../../shared/mechanics/index";
import { FLIGHT_WINDOW_MS, flightWindow } from "../../../shared/mechanics/compute-shot";

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/** Puck marks lagging back along the flight by `lagPxPerFrame` on each of the first `frames` after release, then recovered. */
function withBladeLag(puck: Mark[], release: number, frames: number, lagPxPerFrame: number): Mark[] {
  const at = (f: number) => puck.find((m) => m[0] === f)!;
  const dir = (() => {
    const a = at(release), b = at(release + 1);
    const d = Math.hypot(b[1] - a[1], b[2] - a[2]);
    return [(b[1] - a[1]) / d, (b[2] - a[2]) / d];
  })();
  return puck.map(([f, x, y]) => {
    const k = f - release;
    if (k < 0 || k >= frames) return [f, x, y];
    const lag = lagPxPerFrame * k;
    return [f, x - dir[0] * lag, y - dir[1] * lag];
  });
}

describe("puck exit speed over a flight window defined in time", () => {
  it.each([240, 1000, 3200])("spans %i fps flight over the same 40 ms", (fps) => {
    const { doc } = syntheticShot({ captureFps: fps, frames: Math.round(fps * 0.2) });
    const r = computeShot({ ...doc, cutoffHz: "raw" }, { trials: 20 });
    const spanMs = ((r.puckExitSpeed.toFrame - r.puckExitSpeed.fromFrame) * 1000) / fps;
    expect(spanMs).toBeLessThanOrEqual(FLIGHT_WINDOW_MS);
    expect(spanMs).toBeGreaterThan(FLIGHT_WINDOW_MS - 1000 / fps - 1e-9);
    if (fps === 240) expect(r.puckExitSpeed.marksUsed).toBe(10); // as before at 240 fps
  });

  it("a lag beside the blade over the first 2.8 ms at 3,200 fps moves the speed by under 1 %", () => {
    const { doc, truth } = syntheticShot({ captureFps: 3200, frames: 640 });
    const release = doc.events.release;
    const puck = withBladeLag(doc.tracks.puck as Mark[], release, 9, 0.5);
    const r = computeShot({ ...doc, tracks: { ...doc.tracks, puck }, cutoffHz: "raw" }, { trials: 20 });
    expect(rel(r.puckExitSpeed.valueMps, truth.exitSpeedMps)).toBeLessThan(0.01);
  });

  it("uses the first three flight marks when the window holds fewer (sparse digitising)", () => {
    expect(flightWindow([100, 400, 700, 1000], 100, 3200)).toEqual({ lastFrame: Infinity, limit: 3 });
    expect(flightWindow([100, 101, 102, 500], 100, 3200)).toEqual({ lastFrame: 228, limit: Infinity });
  });
});
