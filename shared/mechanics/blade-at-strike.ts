import type { CalibrationMap } from "./calibration";
import { linearState } from "./linear-response";
import type { Source } from "./sources";
import type { EndMotion } from "./smoothing-bias";
import { frameStepS, type TimeBase } from "./time-base";
import { gridSegments, smoothSegment, type WorldTrack } from "./track-smoothing";
import { hypot } from "./hypot";

// Blade speed at puck strike. The puck-strike frame is the analyst's judgement, good to ±e frames;
// a frame after the true impact already shows the blade on its slower path, and the end of a
// smoothed piece leans on its last mark: marked one frame late, the speed read at the marked frame
// came out 27 % low (the synthetic shot at 1,000 fps, 20 % speed lost at impact). So the speed is
// read at the end of the approach cut ⌈e⌉ frames before the marked frame — a frame the impact cannot
// have reached if the mark is good to ±e — and carried on to the strike instant along the cubic
// fitted to the last marks: v(t*) = v(t_end) + a·Δt + j·Δt²/2, Δt = t* − t_end. Each trial draws the true instant t*
// uniformly within ±e frames of the marked frame (GUM 4.3.7, a quantity known only to lie within
// bounds), so a blade still accelerating at strike carries that in its uncertainty, and one at its
// fastest next to none. With e = 0 the approach ends at the marked frame itself.

export interface BladeAtStrike {
  /** Last frame of the approach the speed is read from. */
  frame: number;
  /** First frame the end speed mostly rests on (for timing notes). */
  fromFrame: number;
  speed: number;
  /** One trial: calibration, digitising noise and the true strike instant `offsetFrames` from the marked frame. */
  sample(cal: CalibrationMap, normal: () => number, offsetFrames: number): number;
}

/**
 * `motionAt(frame)` is the blade's acceleration and jerk at the end of an approach ending at that
 * frame, or null (the speed is then held). Offsets are in frames of `time` around the marked strike.
 */
export function bladeAtStrike(
  src: Source,
  world: WorldTrack,
  strike: number,
  eventErrorFrames: number,
  cutoffHz: number | null,
  cal: CalibrationMap,
  sigmaPx: number,
  fps: number,
  time: TimeBase,
  motionAt: (frame: number) => EndMotion | null,
): BladeAtStrike | null {
  const cut = strike - Math.ceil(eventErrorFrames);
  const [grid] = gridSegments(world, [cut], ["beforeStrike", "afterStrike"], fps, undefined, time);
  if (!grid || grid.frames[0] > cut || grid.frames.length < 3 || cut - grid.frames[grid.frames.length - 1] > grid.step) return null;
  const pre = smoothSegment(grid, cutoffHz);
  const i = pre.frames.length - 1;
  const end = pre.frames[i];
  const state = linearState(src, pre, i, cal, sigmaPx);
  const v0 = hypot(state.nominal.vx, state.nominal.vy);
  const dir: [number, number] = v0 > 0 ? [state.nominal.vx / v0, state.nominal.vy / v0] : [1, 0];
  const m = motionAt(end);
  // Along the direction of motion, m/s² and m/s³.
  const a = m ? (m.accel[0] * dir[0] + m.accel[1] * dir[1]) / 1000 : 0;
  const j = m ? (m.jerk[0] * dir[0] + m.jerk[1] * dir[1]) / 1000 : 0;
  // Seconds from the approach's end to the strike instant δ frames off the marked frame.
  const toStrike = time.between(end, strike);
  const before = frameStepS(time, strike - 1);
  const after = frameStepS(time, strike);
  const reach = (offset: number) => toStrike + offset * (offset < 0 ? before : after);
  const carried = (speed: number, offset: number) => {
    const dt = reach(offset);
    return speed + a * dt + (j * dt * dt) / 2;
  };
  return {
    frame: end,
    fromFrame: pre.frames[Math.max(0, i - 2)],
    speed: carried(v0, 0),
    sample(c, normal, offset) {
      const v = state.sample(c, normal);
      return carried(hypot(v.vx, v.vy), offset);
    },
  };
}
