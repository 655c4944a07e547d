import type { ResultNote, SegmentLabel, Series, ShotResults, SmoothedLandmark } from "../schemas/shot-results";
import type { ShotDocument } from "../schemas/shot-document";
import type { ChordGeometry } from "./bend";
import type { Vec2 } from "./homography";
import { bladeAtStrike } from "./blade-at-strike";
import { SeriesColumns } from "./series-columns";
import { planeMap, scaleBarMap, type CalibrationMap } from "./calibration";
import { eventTiming } from "./event-timing";
import { flightTrials } from "./flight-trials";
import { fitConstantVelocity } from "./line-fit";
import { bendSeries, findPeak, peakBend, type BendPoint, type SmoothedSource } from "./peak-bend";
import { plausibilityNotes } from "./plausibility";
import { shotCutoffs } from "./shot-cutoffs";
import { cutsFor, STICK_KEYS, type CutoffMode } from "./shot-smoothing";
import { endMotion } from "./smoothing-bias";
import { bladeSource, worldTrack, type BladePoint, type Source, type SourceKey } from "./sources";
import { storedEnergy } from "./stored-energy";
import { describeIrregularity, rateTimeBase, timesOf, type TimeBase } from "./time-base";
import { gridSegments, lowerBound, smoothSegment, speedAt } from "./track-smoothing";
import { hashNumbers, normalSource, spreadOf, uniformSource, type Spread } from "./uncertainty";
import { MIN_FLIGHT_MARKS, parseShotDocument, type ImageTrack } from "./validate-shot";
import { ENGINE_VERSION } from "./version";
import { hypot } from "./hypot";

export interface ComputeShotOptions {
  /** Monte Carlo trials for the uncertainties (default 400, at least 20). */
  trials?: number;
  /** Seed of the trials (default: DEFAULT_SEED and a hash of the document); the same document and seed give the same results. */
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

/** Hash of everything in the document that the results depend on (uncertainty.ts, hashNumbers). */
function documentHash(doc: ShotDocument, tracks: ReturnType<typeof parseShotDocument>["tracks"]): string {
  const c = doc.calibration;
  const cal = c.type === "scaleBar" ? [...c.a, ...c.b, c.lengthMm] : c.points.flatMap((p) => [...p.image, ...p.world]);
  const e = doc.events;
  const head = [doc.captureFps, doc.pixelErrorPx, doc.calibrationErrorRel, doc.eventErrorFrames, e.iceStrike ?? -1, e.puckStrike, e.peakBend ?? -1, e.release, doc.stick?.flex ?? -1, doc.stick?.benchSpanMm ?? -1];
  const groups: ArrayLike<number>[] = [head, cal];
  for (const t of Object.values(tracks)) if (t) groups.push(t.frames, t.x, t.y);
  return hashNumbers(groups);
}

function spreadFields(s: Spread | null): { u: number | null; interval95: [number, number] | null } {
  return s ? { u: s.u, interval95: s.interval95 } : { u: null, interval95: null };
}

/**
 * The results the server stores for a shot, and the ones Digitise previews while marking: one
 * computation (default trials and seed), so every page, the PDF and the CSV show the same ±.
 */
export function storedShotResults(doc: unknown): ShotResults {
  return computeShot(doc);
}

/** Validate a shot document and derive its results; throws MechanicsInputError for unusable input. */
export function computeShot(input: unknown, opts: ComputeShotOptions = {}): ShotResults {
  const { doc, tracks, clip, time } = parseShotDocument(input);
  const trials = opts.trials ?? DEFAULT_TRIALS;
  if (!Number.isInteger(trials) || trials < 20) throw new RangeError(`trials must be a whole number of at least 20 (got ${trials})`);
  const seed = opts.seed ?? `${DEFAULT_SEED}:${documentHash(doc, tracks)}`;
  const fps = doc.captureFps;
  const sigmaPx = doc.pixelErrorPx;
  const { puckStrike: strike, release, iceStrike } = doc.events;
  const cal = nominalCalibration(doc.calibration);
  const notes: ResultNote[] = [];
  const normal = normalSource(seed);
  const uniform = uniformSource(`${seed}:events`);
  /** Capture time from frame a to frame b, ms (the clip's frame clock when the document has it). */
  const ms = (a: number, b: number) => time.between(a, b) * 1000;

  // Sources: the puck, the blade point, and the stick's landmarks.
  const sources: Source[] = [{ key: "puck", parts: [tracks.puck!], names: ["puck"] }];
  const blade = bladeSource(tracks.bladeHeel, tracks.bladeToe, strike);
  if (blade) sources.push(blade.source);
  for (const k of STICK_KEYS) if (tracks[k]?.frames.length) sources.push({ key: k, parts: [tracks[k] as ImageTrack], names: [k] });
  const worlds = new Map(sources.map((src) => [src.key, worldTrack(src, cal)]));

  const mode: CutoffMode = doc.cutoffHz;
  const { cutoffs, blade: bladeCut, bend: bendCut } = shotCutoffs({ sources, worlds, events: doc.events, eventErrorFrames: doc.eventErrorFrames, mode, cal, sigmaPx, fps, time, notes });

  const smoothed = new Map<SourceKey, SmoothedSource>();
  for (const src of sources) {
    const cuts = cutsFor(src.key, strike, release);
    const grids = gridSegments(worlds.get(src.key)!, cuts.splits, cuts.labels, fps, undefined, time);
    const cutoffHz = cutoffs.get(src.key) ?? null;
    const longestGap = Math.max(0, ...grids.map((g) => g.longestGapFrames));
    if (longestGap > 0 && src.key !== "blade")
      notes.push({ code: "TRACK_GAPS", message: `${src.names.join("+")} has unmarked frames (longest run ${longestGap}) bridged by straight lines before smoothing` });
    smoothed.set(src.key, { src, cutoffHz, segments: grids.map((g) => smoothSegment(g, cutoffHz)) });
  }

  // Puck exit speed: straight-line fit over the flight's first FLIGHT_WINDOW_MS.
  const puckSrc = sources[0];
  const flightSpan = flightWindow(tracks.puck!.frames, release, fps, time);
  const flight = worldTrack(puckSrc, cal, release, flightSpan.lastFrame, undefined, flightSpan.limit);
  const flightTimes = timesOf(time, flight.frames);
  const fit = fitConstantVelocity(flightTimes, flight.x, flight.y);
  const flightDraws = flightTrials(puckSrc, lowerBound(tracks.puck!.frames, flight.frames[0]), flightTimes, cal, sigmaPx);
  timingNote(notes, time, "puck exit speed's straight-line fit", flight.frames[0], flight.frames[flight.frames.length - 1]);

  // Blade speed at strike, with the strike frame's own uncertainty; and its smoothing bias.
  const bladeSm = smoothed.get("blade");
  const eventError = doc.eventErrorFrames;
  const bladeAccel = (end: number) => (bladeCut?.accelFromHz != null ? endMotion(worlds.get("blade")!, end, bladeCut.accelFromHz, fps, time) : null);
  const bladeAt = bladeSm ? bladeAtStrike(bladeSm.src, worlds.get("blade")!, strike, eventError, bladeSm.cutoffHz, cal, sigmaPx, fps, time, bladeAccel) : null;
  if (bladeAt) timingNote(notes, time, "blade speed at strike", bladeAt.fromFrame, strike);
  if (bladeSm && !bladeAt)
    notes.push({ code: "BLADE_NOT_AT_STRIKE", message: "the blade needs at least 3 marks up to the puck-strike frame, the last on or just before it: no blade speed at strike" });
  const bladeBias = !bladeAt || bladeSm?.cutoffHz == null ? 0 : (bladeCut?.biasAt(bladeSm.cutoffHz) ?? 0);

  // Bend at every frame where top hand, bottom hand and blade heel are all marked; its peak.
  const top = smoothed.get("topHand");
  const bottom = smoothed.get("bottomHand");
  const heel = smoothed.get("bladeHeel");
  const bend = top && bottom && heel && opts.series !== false ? bendSeries(top, bottom, heel) : null;
  const peakPoint: BendPoint | null = top && bottom && heel ? findPeak(top, bottom, heel, iceStrike ?? -Infinity, release) : null;
  if (!peakPoint && (top || bottom || heel))
    notes.push({ code: "BEND_NOT_AVAILABLE", message: "bend needs top hand, bottom hand and blade heel marked on the same frames between ice strike and release" });
  const peak = peakPoint ? peakBend(peakPoint, [top!, bottom!, heel!], cal, sigmaPx) : null;
  let geometryOk = false;
  if (peak) {
    // Top hand on the blade heel (a mis-mark) leaves no chord to measure from.
    geometryOk = Object.values(peak.nominal.geometry).every(Number.isFinite);
    if (!geometryOk) notes.push({ code: "BEND_GEOMETRY", message: `at frame ${peak.point.frame} the top hand and the blade heel coincide: no deflection or stored energy` });
  }
  const stick = doc.stick ?? null;
  const energyOf = (g: ChordGeometry) => (stick ? storedEnergy(stick.flex, stick.benchSpanMm, g) : null);
  const energyNominal = peak && geometryOk ? energyOf(peak.nominal.geometry) : null;
  if (stick && peak && geometryOk && !energyNominal)
    notes.push({ code: "STORED_ENERGY_GEOMETRY", message: "the bottom hand does not lie between the top hand and the blade heel along the shaft: no stored energy" });
  if (stick && !peak) notes.push({ code: "STORED_ENERGY_NEEDS_BEND", message: "a stick is given but the bend could not be measured: no stored energy" });
  if (peak && doc.events.peakBend !== undefined && Math.abs(doc.events.peakBend - peak.point.frame) > Math.max(3, Math.round(fps / 1000)))
    notes.push({ code: "PEAK_BEND_EVENT_DIFFERS", message: `the marked peak-bend frame ${doc.events.peakBend} differs from the largest measured bend at frame ${peak.point.frame}` });
  // Smoothing bias at the peak (value − truth): carried from the residual-analysis cutoff, or what
  // one more smoothing changes at the analyst's cutoff (twicing; smoothing-bias.ts). Deflection
  // follows the bend in proportion (the bend of a shallow arc is linear in its deflection), energy
  // twice over (it goes with the square).
  const angleBias = !peak || top?.cutoffHz == null ? 0 : (bendCut?.bias ?? peak.twice.angleDeg - peak.nominal.angleDeg);
  const relBias = peak && peak.nominal.angleDeg > 0 ? angleBias / peak.nominal.angleDeg : 0;
  const bendBias = peak ? { angle: angleBias, defl: relBias * peak.nominal.geometry.deflectionMm } : null;
  const energyBias = energyNominal ? 2 * relBias * energyNominal.valueJ : 0;

  // Monte Carlo: jitter every digitised point, the calibration scale and the marked events.
  const timing = eventTiming(doc.events, eventError, time);
  const dPuck: number[] = [];
  const dBlade: number[] = [];
  const dAngle: number[] = [];
  const dDefl: number[] = [];
  const dEnergy: number[] = [];
  for (let t = 0; t < trials; t++) {
    const c = trialCalibration(doc.calibration, normal, sigmaPx, doc.calibrationErrorRel);
    const dv = flightDraws.sample(c, normal);
    dPuck.push(hypot(fit.vxMps + dv[0], fit.vyMps + dv[1]) - fit.speedMps);
    const strikeShift = eventError * (2 * uniform() - 1);
    if (bladeAt) dBlade.push(bladeAt.sample(c, normal, strikeShift) - bladeAt.speed);
    if (peak) {
      const b = peak.sample(c, normal);
      dAngle.push(b.angleDeg - peak.nominal.angleDeg);
      if (geometryOk) dDefl.push(b.geometry.deflectionMm - peak.nominal.geometry.deflectionMm);
      if (energyNominal) {
        const e = energyOf(b.geometry);
        dEnergy.push(e ? e.valueJ - energyNominal.valueJ : NaN);
      }
    }
  }

  const puckU = spreadFields(spreadOf(fit.speedMps, dPuck));
  const bladeU = bladeAt ? spreadFields(spreadOf(bladeAt.speed, dBlade, bladeBias)) : null;
  const angleU = peak ? spreadFields(spreadOf(peak.nominal.angleDeg, dAngle, bendBias!.angle)) : null;
  const deflU = peak && geometryOk ? spreadFields(spreadOf(peak.nominal.geometry.deflectionMm, dDefl, bendBias!.defl)) : null;
  const energyU = energyNominal ? spreadFields(spreadOf(energyNominal.valueJ, dEnergy, energyBias)) : null;

  // Time series for the readout charts.
  const firstFrame = clip ? clip[0] : (doc.frameTimes?.firstFrame ?? 0);
  if (iceStrike !== undefined) timingNote(notes, time, "load time", iceStrike, strike);
  timingNote(notes, time, "contact time", strike, release);
  const side = (frame: number): SegmentLabel => (frame <= strike ? "beforeStrike" : "afterStrike");
  const speedSeries = (s: SmoothedSource | undefined): Series => {
    const out = new SeriesColumns("m/s");
    if (!s || opts.series === false) return out.done();
    for (const g of s.segments)
      for (let i = 0; i < g.frames.length; i++) {
        const v = speedAt(g, i);
        if (g.marked[i] && Number.isFinite(v)) out.push(g.frames[i], ms(strike, g.frames[i]), v, g.label === "whole" ? side(g.frames[i]) : g.label);
      }
    return out.done();
  };
  const bendAngle = new SeriesColumns("deg");
  if (bend) bend.frames.forEach((f, k) => bendAngle.push(f, ms(strike, f), bend.angles[k], side(f)));

  const cutoffHz: Partial<Record<SmoothedLandmark, number | null>> = {};
  for (const [k, s] of smoothed) cutoffHz[k] = s.cutoffHz;
  const geometry = peak && geometryOk ? peak.nominal.geometry : null;

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
        ? {
            valueMps: bladeAt.speed,
            uncertaintyMps: bladeU.u,
            interval95Mps: bladeU.interval95,
            frame: bladeAt.frame,
            point: blade.point as BladePoint,
            smoothingBiasMps: bladeBias,
          }
        : null,
    peakBend:
      peak && angleU
        ? { angleDeg: peak.nominal.angleDeg, uncertaintyDeg: angleU.u, interval95Deg: angleU.interval95, frame: peak.point.frame, smoothingBiasDeg: bendBias!.angle }
        : null,
    shaftDeflection:
      peak && deflU && geometry
        ? {
            valueMm: geometry.deflectionMm,
            uncertaintyMm: deflU.u,
            interval95Mm: deflU.interval95,
            frame: peak.point.frame,
            aMm: geometry.aMm,
            bMm: geometry.bMm,
            smoothingBiasMm: bendBias!.defl,
          }
        : null,
    loadTimeMs: iceStrike !== undefined ? ms(iceStrike, strike) : null,
    loadTimeUncertaintyMs: timing.load?.u ?? null,
    loadTimeInterval95Ms: timing.load?.interval95 ?? null,
    contactTimeMs: ms(strike, release),
    contactTimeUncertaintyMs: timing.contact.u,
    contactTimeInterval95Ms: timing.contact.interval95,
    frameTimeMs: time.nominalS * 1000,
    storedEnergy:
      energyNominal && energyU && peak
        ? {
            valueJ: energyNominal.valueJ,
            uncertaintyJ: energyU.u,
            interval95J: energyU.interval95,
            frame: peak.point.frame,
            shotStiffnessNPerM: energyNominal.stiffnessNPerM,
            eiNm2: energyNominal.eiNm2,
            smoothingBiasJ: energyBias,
          }
        : null,
    series: {
      firstFrame,
      puckSpeed: speedSeries(smoothed.get("puck")),
      bladeSpeed: speedSeries(bladeSm),
      bendAngle: bendAngle.done(),
    },
    smoothing: {
      mode: mode === "raw" ? "raw" : mode === "auto" ? "residualAnalysis" : "analyst",
      order: 2,
      passes: 2,
      cutoffHz,
    },
    uncertainty: {
      method: "monteCarlo",
      trials,
      seed,
      pixelErrorPx: sigmaPx,
      calibrationErrorRel: doc.calibrationErrorRel,
      eventErrorFrames: eventError,
      coverage: 0.95,
    },
    calibration: { type: cal.type, mmPerPx: cal.mmPerPx ?? null, rmsResidualMm: cal.rmsResidualMm },
  };

  const i0 = lowerBound(tracks.puck!.frames, release);
  const scatterMm = sigmaPx * cal.mmPerPxAt([tracks.puck!.x[i0], tracks.puck!.y[i0]]);
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
