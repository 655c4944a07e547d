import type { ResultNote, SegmentLabel, SeriesPoint, ShotResults, SmoothedLandmark } from "../schemas/shot-results";
import type { ShotDocument } from "../schemas/shot-document";
import type { Vec2 } from "./homography";
import { bendAngleDeg, chordGeometry, type ChordGeometry } from "./bend";
import { planeMap, scaleBarMap, type CalibrationMap } from "./calibration";
import { fitConstantVelocity } from "./line-fit";
import { plausibilityNotes } from "./plausibility";
import { linearState, type LinearState } from "./linear-response";
import { cutsFor, chooseCutoff, type CutoffMode } from "./shot-smoothing";
import { bladeSource, lowerBound, worldTrack, type BladePoint, type Noise, type Source, type SourceKey } from "./sources";
import { storedEnergy } from "./stored-energy";
import { describeIrregularity, rateTimeBase, timesOf, type TimeBase } from "./time-base";
import { gridIndex, gridSegments, smoothSegment, type SmoothSegment } from "./track-smoothing";
import { normalSource, spreadOf, type Spread } from "./uncertainty";
import { MIN_FLIGHT_MARKS, parseShotDocument, type ImageTrack } from "./validate-shot";
import { ENGINE_VERSION } from "./version";

export interface ComputeShotOptions {
  /** Monte Carlo trials for the uncertainties (default 400, at least 20). */
  trials?: number;
  /** Seed of the trials; the same document and seed give the same results. */
  seed?: string;
  /** Include the time series (default true). */
  series?: boolean;
}

export const DEFAULT_TRIALS = 400;
export const DEFAULT_SEED = "loadframe";
/**
 * Puck exit speed is fitted over the flight's first FLIGHT_WINDOW_MS from release (or until the
 * puck leaves the frame), so the window is the same stretch of flight at every capture rate: ten
 * marks at 240 fps, 128 at 3,200 fps — not ten marks, which at 3,200 fps are 2.8 ms all beside the
 * blade. Fewer than MIN_FLIGHT_MARKS marks in the window: the first MIN_FLIGHT_MARKS after release.
 */
export const FLIGHT_WINDOW_MS = 40;

interface Smoothed {
  src: Source;
  cutoffHz: number | null;
  segments: SmoothSegment[];
}

interface BendState {
  angleDeg: number;
  geometry: ChordGeometry;
}

const STICK_KEYS = ["bladeHeel", "bottomHand", "topHand"] as const;

function seg(s: Smoothed | undefined, label: SegmentLabel): SmoothSegment | undefined {
  return s?.segments.find((g) => g.label === label);
}

/** Calibration with every digitised calibration point jittered and the scale off by its relative error. */
function trialCalibration(c: ShotDocument["calibration"], normal: () => number, sigmaPx: number, rel: number): CalibrationMap {
  const jitter = (p: Vec2): Vec2 => [p[0] + sigmaPx * normal(), p[1] + sigmaPx * normal()];
  const scale = 1 + rel * normal();
  if (c.type === "scaleBar") return scaleBarMap(jitter(c.a), jitter(c.b), c.lengthMm * scale);
  let cx = 0;
  let cy = 0;
  for (const p of c.points) {
    cx += p.world[0] / c.points.length;
    cy += p.world[1] / c.points.length;
  }
  return planeMap(c.points.map((p) => ({ image: jitter(p.image), world: [cx + (p.world[0] - cx) * scale, cy + (p.world[1] - cy) * scale] as Vec2 })));
}

function nominalCalibration(c: ShotDocument["calibration"]): CalibrationMap {
  return c.type === "scaleBar" ? scaleBarMap(c.a, c.b, c.lengthMm) : planeMap(c.points);
}

function spreadFields(s: Spread | null): { u: number | null; interval95: [number, number] | null } {
  return s ? { u: s.u, interval95: s.interval95 } : { u: null, interval95: null };
}

/** A note when the frames a result rests on include a gap or a repeated frame in the clip's timing. */
function timingNote(notes: ResultNote[], time: TimeBase, what: string, a: number, b: number): void {
  const found = time.irregularities(a, b);
  if (!found.length) return;
  const more = found.length > 1 ? ` and ${found.length - 1} more` : "";
  notes.push({
    code: "TIMING_GAP",
    message: `${what} spans ${describeIrregularity(found[0])}${more}: it uses each frame's own capture time, but whatever happened in the missing time was not filmed`,
  });
}

/** Validate a shot document and derive its results; throws MechanicsInputError for unusable input. */
export function computeShot(input: unknown, opts: ComputeShotOptions = {}): ShotResults {
  const { doc, tracks, clip, time } = parseShotDocument(input);
  const trials = opts.trials ?? DEFAULT_TRIALS;
  if (!Number.isInteger(trials) || trials < 20) throw new RangeError(`trials must be a whole number of at least 20 (got ${trials})`);
  const seed = opts.seed ?? DEFAULT_SEED;
  const fps = doc.captureFps;
  const { puckStrike: strike, release, iceStrike } = doc.events;
  const cal = nominalCalibration(doc.calibration);
  const notes: ResultNote[] = [];
  const normal = normalSource(seed);
  /** Capture time from frame a to frame b, ms (the clip's frame clock when the document has it). */
  const ms = (a: number, b: number) => time.between(a, b) * 1000;

  // Sources and their smoothing.
  const sources: Source[] = [{ key: "puck", parts: [tracks.puck!], names: ["puck"] }];
  const blade = bladeSource(tracks.bladeHeel, tracks.bladeToe, strike);
  if (blade) sources.push(blade.source);
  for (const k of STICK_KEYS) if (tracks[k]?.frames.length) sources.push({ key: k, parts: [tracks[k] as ImageTrack], names: [k] });

  const mode: CutoffMode = doc.cutoffHz;
  const byNames = new Map<string, number | null>();
  const smoothed = new Map<SourceKey, Smoothed>();
  for (const src of sources) {
    const cuts = cutsFor(src.key, strike, release);
    const grids = gridSegments(worldTrack(src, cal), cuts.splits, cuts.labels, fps, undefined, time);
    const name = src.names.join("+");
    let cutoffHz = byNames.get(name);
    if (cutoffHz === undefined) {
      const c = chooseCutoff(grids, mode, name);
      cutoffHz = c.cutoffHz;
      byNames.set(name, cutoffHz);
      if (c.tooFew) notes.push({ code: "TOO_FEW_MARKS_TO_SMOOTH", message: `${name} has too few consecutive marks for residual analysis: used unsmoothed` });
    }
    const longestGap = Math.max(0, ...grids.map((g) => g.longestGapFrames));
    if (longestGap > 0 && src.key !== "blade")
      notes.push({ code: "TRACK_GAPS", message: `${name} has unmarked frames (longest run ${longestGap}) bridged by straight lines before smoothing` });
    smoothed.set(src.key, { src, cutoffHz, segments: grids.map((g) => smoothSegment(g, cutoffHz)) });
  }

  // Puck exit speed: straight-line fit over the first flight marks.
  const puckSrc = sources[0];
  const flightSpan = flightWindow(tracks.puck!.frames, release, fps, time);
  const flight = worldTrack(puckSrc, cal, release, flightSpan.lastFrame, undefined, flightSpan.limit);
  const flightTimes = timesOf(time, flight.frames);
  const fit = fitConstantVelocity(flightTimes, flight.x, flight.y);
  timingNote(notes, time, "puck exit speed's straight-line fit", flight.frames[0], flight.frames[flight.frames.length - 1]);

  // Blade speed at strike, from the smoothed piece before strike.
  const bladeSm = smoothed.get("blade");
  const pre = seg(bladeSm, "beforeStrike");
  let bladeAt: { frame: number; speed: number; state: LinearState } | null = null;
  if (pre && bladeSm && pre.frames.length >= 3 && strike - pre.frames[pre.frames.length - 1] <= pre.step) {
    const i = pre.frames.length - 1;
    bladeAt = { frame: pre.frames[i], speed: Math.hypot(pre.vx[i], pre.vy[i]), state: linearState(bladeSm.src, pre, i, cal, doc.pixelErrorPx) };
    timingNote(notes, time, "blade speed at strike", pre.frames[Math.max(0, i - 2)], strike);
  } else if (bladeSm) {
    notes.push({ code: "BLADE_NOT_AT_STRIKE", message: "the blade needs at least 3 marks up to the puck-strike frame, the last on or just before it: no blade speed at strike" });
  }

  // Bend at every frame where top hand, bottom hand and blade heel are all marked.
  const top = smoothed.get("topHand");
  const bottom = smoothed.get("bottomHand");
  const heel = smoothed.get("bladeHeel");
  const bendPoints: { frame: number; label: SegmentLabel; angle: number }[] = [];
  if (top && bottom && heel) {
    for (const label of ["beforeStrike", "afterStrike"] as const) {
      const [T, B, H] = [seg(top, label), seg(bottom, label), seg(heel, label)];
      if (!T || !B || !H) continue;
      for (let i = 0; i < H.frames.length; i++) {
        if (!H.marked[i]) continue;
        const f = H.frames[i];
        const it = gridIndex(T, f);
        const ib = gridIndex(B, f);
        if (it < 0 || ib < 0 || !T.marked[it] || !B.marked[ib]) continue;
        const angle = bendAngleDeg([T.sx[it], T.sy[it]], [B.sx[ib], B.sy[ib]], [H.sx[i], H.sy[i]]);
        bendPoints.push({ frame: f, label, angle });
      }
    }
  }
  const from = iceStrike ?? -Infinity;
  let peak: (typeof bendPoints)[number] | null = null;
  for (const p of bendPoints) if (p.frame >= from && p.frame <= release && (!peak || p.angle > peak.angle)) peak = p;
  if (!peak && (top || bottom || heel))
    notes.push({ code: "BEND_NOT_AVAILABLE", message: "bend needs top hand, bottom hand and blade heel marked on the same frames between ice strike and release" });

  // The three landmark states at the peak frame, as linear functions of the marks for the trials.
  let bendStates: LinearState[] | null = null;
  let peakGeometry: ChordGeometry | null = null;
  if (peak) {
    const p = peak;
    bendStates = [top!, bottom!, heel!].map((s) => {
      const g = seg(s, p.label)!;
      return linearState(s.src, g, gridIndex(g, p.frame), cal, doc.pixelErrorPx);
    });
    const [pt, pb, ph] = bendStates.map((st) => [st.nominal.x, st.nominal.y] as Vec2);
    const g = chordGeometry(pt, pb, ph);
    // Top hand on the blade heel (a mis-mark) leaves no chord to measure from.
    if (Object.values(g).every(Number.isFinite)) peakGeometry = g;
    else notes.push({ code: "BEND_GEOMETRY", message: `at frame ${p.frame} the top hand and the blade heel coincide: no deflection or stored energy` });
  }
  const bendTrial = (c: CalibrationMap): BendState => {
    const [pt, pb, ph] = bendStates!.map((st) => {
      const v = st.sample(c, normal);
      return [v.x, v.y] as Vec2;
    });
    return { angleDeg: bendAngleDeg(pt, pb, ph), geometry: chordGeometry(pt, pb, ph) };
  };
  const stick = doc.stick ?? null;
  const energyNominal = stick && peakGeometry ? storedEnergy(stick.flex, stick.benchSpanMm, peakGeometry) : null;
  if (stick && peakGeometry && !energyNominal)
    notes.push({ code: "STORED_ENERGY_GEOMETRY", message: "the bottom hand does not lie between the top hand and the blade heel along the shaft: no stored energy" });
  if (stick && !peak) notes.push({ code: "STORED_ENERGY_NEEDS_BEND", message: "a stick is given but the bend could not be measured: no stored energy" });
  if (peak && doc.events.peakBend !== undefined && Math.abs(doc.events.peakBend - peak.frame) > Math.max(3, Math.round(fps / 1000)))
    notes.push({ code: "PEAK_BEND_EVENT_DIFFERS", message: `the marked peak-bend frame ${doc.events.peakBend} differs from the largest measured bend at frame ${peak.frame}` });

  // Monte Carlo: jitter every digitised point and the calibration scale, recompute locally.
  const noise: Noise = { normal, sigmaPx: doc.pixelErrorPx };
  const dPuck: number[] = [];
  const dBlade: number[] = [];
  const dAngle: number[] = [];
  const dDefl: number[] = [];
  const dEnergy: number[] = [];
  for (let t = 0; t < trials; t++) {
    const c = trialCalibration(doc.calibration, normal, doc.pixelErrorPx, doc.calibrationErrorRel);
    const w = worldTrack(puckSrc, c, release, flightSpan.lastFrame, noise, flightSpan.limit);
    dPuck.push(fitConstantVelocity(flightTimes, w.x, w.y).speedMps - fit.speedMps);
    if (bladeAt) {
      const st = bladeAt.state.sample(c, normal);
      dBlade.push(Math.hypot(st.vx, st.vy) - bladeAt.speed);
    }
    if (peak && bendStates) {
      const b = bendTrial(c);
      dAngle.push(b.angleDeg - peak.angle);
      if (peakGeometry) dDefl.push(b.geometry.deflectionMm - peakGeometry.deflectionMm);
      if (energyNominal && stick) {
        const e = storedEnergy(stick.flex, stick.benchSpanMm, b.geometry);
        dEnergy.push(e ? e.valueJ - energyNominal.valueJ : NaN);
      }
    }
  }

  const puckU = spreadFields(spreadOf(fit.speedMps, dPuck));
  const bladeU = bladeAt ? spreadFields(spreadOf(bladeAt.speed, dBlade)) : null;
  const angleU = peak ? spreadFields(spreadOf(peak.angle, dAngle)) : null;
  const deflU = peakGeometry ? spreadFields(spreadOf(peakGeometry.deflectionMm, dDefl)) : null;
  const energyU = energyNominal ? spreadFields(spreadOf(energyNominal.valueJ, dEnergy)) : null;

  // Time series for the readout charts.
  const firstFrame = clip ? clip[0] : (doc.frameTimes?.firstFrame ?? 0);
  if (iceStrike !== undefined) timingNote(notes, time, "load time", iceStrike, strike);
  timingNote(notes, time, "contact time", strike, release);
  const point = (frame: number, label: SegmentLabel, value: number): SeriesPoint => ({
    frame,
    tMs: ms(firstFrame, frame),
    tFromStrikeMs: ms(strike, frame),
    value,
    segment: label,
  });
  const speedSeries = (s: Smoothed | undefined): SeriesPoint[] => {
    const out: SeriesPoint[] = [];
    if (!s || opts.series === false) return out;
    for (const g of s.segments)
      for (let i = 0; i < g.frames.length; i++) {
        const v = Math.hypot(g.vx[i], g.vy[i]);
        if (g.marked[i] && Number.isFinite(v)) out.push(point(g.frames[i], g.label, v));
      }
    return out;
  };

  const cutoffHz: Partial<Record<SmoothedLandmark, number | null>> = {};
  for (const [k, s] of smoothed) cutoffHz[k] = s.cutoffHz;

  const body: Omit<ShotResults, "notes"> = {
    engineVersion: ENGINE_VERSION,
    puckExitSpeed: {
      valueMps: fit.speedMps,
      uncertaintyMps: puckU.u,
      interval95Mps: puckU.interval95,
      marksUsed: flight.frames.length,
      fromFrame: flight.frames[0],
      toFrame: flight.frames[flight.frames.length - 1],
      rmsResidualMm: fit.rmsResidualMm,
    },
    bladeSpeedAtStrike:
      bladeAt && bladeU && blade
        ? { valueMps: bladeAt.speed, uncertaintyMps: bladeU.u, interval95Mps: bladeU.interval95, frame: bladeAt.frame, point: blade.point as BladePoint }
        : null,
    peakBend: peak && angleU ? { angleDeg: peak.angle, uncertaintyDeg: angleU.u, interval95Deg: angleU.interval95, frame: peak.frame } : null,
    shaftDeflection:
      peak && deflU && peakGeometry
        ? {
            valueMm: peakGeometry!.deflectionMm,
            uncertaintyMm: deflU.u,
            interval95Mm: deflU.interval95,
            frame: peak.frame,
            aMm: peakGeometry!.aMm,
            bMm: peakGeometry!.bMm,
          }
        : null,
    loadTimeMs: iceStrike !== undefined ? ms(iceStrike, strike) : null,
    contactTimeMs: ms(strike, release),
    frameTimeMs: time.nominalS * 1000,
    storedEnergy:
      energyNominal && energyU && peak
        ? {
            valueJ: energyNominal.valueJ,
            uncertaintyJ: energyU.u,
            interval95J: energyU.interval95,
            frame: peak.frame,
            shotStiffnessNPerM: energyNominal.stiffnessNPerM,
            eiNm2: energyNominal.eiNm2,
          }
        : null,
    series: {
      firstFrame,
      puckSpeed: { unit: "m/s", points: speedSeries(smoothed.get("puck")) },
      bladeSpeed: { unit: "m/s", points: speedSeries(bladeSm) },
      bendAngle: { unit: "deg", points: opts.series === false ? [] : bendPoints.map((p) => point(p.frame, p.label, p.angle)) },
    },
    smoothing: {
      mode: mode === "raw" ? "raw" : mode === "auto" ? "residualAnalysis" : "analyst",
      order: 2,
      passes: 2,
      cutoffHz,
    },
    uncertainty: { method: "monteCarlo", trials, seed, pixelErrorPx: doc.pixelErrorPx, calibrationErrorRel: doc.calibrationErrorRel, coverage: 0.95 },
    calibration: { type: cal.type, mmPerPx: cal.mmPerPx ?? null, rmsResidualMm: cal.rmsResidualMm },
  };

  const i0 = lowerBound(tracks.puck!.frames, release);
  const scatterMm = doc.pixelErrorPx * cal.mmPerPxAt([tracks.puck!.x[i0], tracks.puck!.y[i0]]);
  notes.push(...plausibilityNotes(body, { captureFps: fps, expectedScatterMm: scatterMm * Math.SQRT2, contactFrames: release - strike, flightMaxResidualMm: fit.maxResidualMm }));
  return { ...body, notes };
}

/** The puck marks of the exit-speed fit: frames release … lastFrame, at most `limit` of them. */
export function flightWindow(puckFrames: ArrayLike<number>, release: number, fps: number, time: TimeBase = rateTimeBase(fps)): { lastFrame: number; limit: number } {
  let lastFrame = release + Math.floor((FLIGHT_WINDOW_MS * fps) / 1000 + 1e-9);
  if (time.fromClock) {
    // The window is capture time: on an uneven clock, the last puck frame within it.
    lastFrame = release;
    for (let i = 0; i < puckFrames.length; i++)
      if (puckFrames[i] > lastFrame && time.between(release, puckFrames[i]) * 1000 <= FLIGHT_WINDOW_MS + 1e-9) lastFrame = puckFrames[i];
  }
  let inWindow = 0;
  for (let i = 0; i < puckFrames.length; i++) if (puckFrames[i] >= release && puckFrames[i] <= lastFrame) inWindow++;
  return inWindow >= MIN_FLIGHT_MARKS ? { lastFrame, limit: Infinity } : { lastFrame: Infinity, limit: MIN_FLIGHT_MARKS };
}
