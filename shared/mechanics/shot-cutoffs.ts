import type { ResultNote } from "../schemas/shot-results";
import type { ShotEvents } from "../schemas/shot-document";
import type { CalibrationMap } from "./calibration";
import { cutoffFromTracks, cutsFor, isStickKey, shapeTracks, type CutoffMode, type FrameWindow } from "./shot-smoothing";
import { bladeEndJudge, peakBendJudge, undersmooth } from "./smoothing-bias";
import { worldTrack, type Source, type SourceKey } from "./sources";
import type { TimeBase } from "./time-base";
import { marksBetween, type WorldTrack } from "./track-smoothing";

// Which cutoff each source is smoothed at (docs/decisions/140-cutoff-and-smoothing-bias.md).
// One cutoff for the puck, one for the blade, one for the stick's three landmarks together.
// Residual analysis looks where each result is measured — the stick's shape from ice strike to
// release, the blade up to puck strike, each with as much again on either side — and then the blade
// and the stick move up until their result's own smoothing bias is small next to its uncertainty.

export interface ShotCutoffs {
  cutoffs: Map<SourceKey, number | null>;
  blade: {
    /** Cutoff whose period sets how far back the blade's acceleration is fitted (residual analysis's). */
    accelFromHz: number | null;
    /** The blade-speed bias at a cutoff (value − truth, m/s). */
    biasAt(fcHz: number): number;
  } | null;
  /** Auto mode: the bend's bias at its cutoff, carried from the residual-analysis cutoff; null otherwise. */
  bend: { bias: number } | null;
}

export function shotCutoffs(o: {
  sources: Source[];
  worlds: Map<SourceKey, WorldTrack>;
  events: ShotEvents;
  /** The blade's speed is read on its approach up to ⌈this⌉ frames before puck strike (blade-at-strike.ts). */
  eventErrorFrames: number;
  mode: CutoffMode;
  cal: CalibrationMap;
  sigmaPx: number;
  fps: number;
  time: TimeBase;
  notes: ResultNote[];
}): ShotCutoffs {
  const { sources, worlds, mode, cal, sigmaPx, fps, time } = o;
  const { puckStrike: strike, release, iceStrike } = o.events;
  const bendFrom = iceStrike ?? strike - (release - strike);
  const span = release - bendFrom;
  const windows: Record<"puck" | "blade" | "stick", FrameWindow> = {
    puck: [-Infinity, Infinity],
    blade: [strike - 2 * span, strike + span],
    stick: [bendFrom - span, release + span],
  };
  const residual = (tracks: WorldTrack[], key: SourceKey, name: string, m: CutoffMode = mode) => {
    const c = cutoffFromTracks(tracks, cutsFor(key, strike, release), fps, time, windows[isStickKey(key) ? "stick" : key === "blade" ? "blade" : "puck"], m, name);
    if (c.tooFew && m === mode) o.notes.push({ code: "TOO_FEW_MARKS_TO_SMOOTH", message: `${name} has too few consecutive marks for residual analysis: used unsmoothed` });
    return c.cutoffHz;
  };

  const cutoffs = new Map<SourceKey, number | null>();
  cutoffs.set("puck", residual([worlds.get("puck")!], "puck", "puck"));

  let blade: ShotCutoffs["blade"] = null;
  const bladeSrc = sources.find((s) => s.key === "blade");
  if (bladeSrc) {
    const world = worlds.get("blade")!;
    const f0 = residual([world], "blade", bladeSrc.names.join("+"));
    // The acceleration is read over the motion's own time scale, whatever cutoff the analyst set.
    const accelFromHz = mode === "auto" ? f0 : residual([world], "blade", "blade", "auto");
    const judge = accelFromHz !== null ? bladeEndJudge(bladeSrc, worldTrack(bladeSrc, cal, -Infinity, strike - Math.ceil(o.eventErrorFrames)), accelFromHz, cal, sigmaPx, fps, time) : null;
    const choice = mode === "auto" && judge && f0 !== null ? undersmooth(f0, judge) : null;
    cutoffs.set("blade", choice?.cutoffHz ?? f0);
    blade = { accelFromHz, biasAt: (fc) => (choice && fc === choice.cutoffHz ? choice.bias : (judge?.(fc)?.bias ?? 0)) };
  }

  let bend: ShotCutoffs["bend"] = null;
  const stick = sources.filter((s) => isStickKey(s.key));
  if (stick.length) {
    const name = `the stick (${stick.map((s) => s.names[0]).join(", ")})`;
    // The shape only over the frames residual analysis looks at (views of the marks, no copy).
    const inWindow = (s: Source) => marksBetween(worlds.get(s.key)!, windows.stick[0], windows.stick[1]).track;
    let fc = residual(shapeTracks(stick.map(inWindow)), "bottomHand", name);
    if (mode === "auto" && fc !== null && stick.length === 3) {
      const [t, b, h] = (["topHand", "bottomHand", "bladeHeel"] as const).map((k) => ({ src: stick.find((s) => s.key === k)!, world: worlds.get(k)! }));
      const choice = undersmooth(fc, peakBendJudge([t, b, h], bendFrom, release, cal, sigmaPx, fps, time));
      if (choice) {
        fc = choice.cutoffHz;
        bend = { bias: choice.bias };
      }
    }
    for (const s of stick) cutoffs.set(s.key, fc);
  }
  return { cutoffs, blade, bend };
}
