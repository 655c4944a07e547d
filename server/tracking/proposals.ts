// What a finished run stores: the tracks as proposed marks with their scores and stops, the events
// proposed from them (seed + proposals), and a scale bar from the puck at rest when the clip has no
// calibration yet.
import { LANDMARKS, PUCK_DIAMETER_MM, type Landmark, type Mark } from "../../shared/schemas/shot-document";
import type { ProposedTrack, TrackingProposals } from "../../shared/schemas/tracking";
import { proposeEvents } from "../../shared/tracking/events";
import type { ShotTrackResult } from "../../shared/tracking/shot-tracker";
import type { TrackStop } from "../../shared/tracking/types";

const r3 = (v: number) => Math.round(v * 1000) / 1000;
const stopInfo = (s: TrackStop) => ({ reason: s.reason, frame: s.frame, message: s.message });

export function buildProposals(seedFrame: number, seeds: Partial<Record<Landmark, [number, number]>>, r: ShotTrackResult, o: { calibrated: boolean }): TrackingProposals {
  const tracks: TrackingProposals["tracks"] = {};
  const withSeeds: Partial<Record<Landmark, Mark[]>> = {};
  for (const k of LANDMARKS) {
    const run = r.tracks[k];
    if (!run) continue;
    const t: ProposedTrack = {
      marks: run.proposals.map((p) => [p.frame, r3(p.x), r3(p.y), Math.round(p.confidence * 1000) / 1000]),
      forward: stopInfo(run.forward),
      backward: stopInfo(run.backward),
    };
    tracks[k] = t;
    withSeeds[k] = [[seedFrame, ...seeds[k]!] as Mark, ...run.proposals.map((p) => [p.frame, p.x, p.y] as Mark)].sort((a, b) => a[0] - b[0]);
  }
  const events = proposeEvents(withSeeds);
  let scaleBar: TrackingProposals["scaleBar"] = null;
  let scaleBarNote: string | null = null;
  if (!o.calibrated) {
    const p = r.puck;
    if (!seeds.puck) scaleBarNote = "No scale bar proposed: the puck was not among the seeds.";
    else if (!p) scaleBarNote = `No scale bar proposed: no puck stood out from the ice at the puck's mark on frame ${seedFrame}.`;
    else if (p.doubt) scaleBarNote = `No scale bar proposed: ${p.doubt}.`;
    else scaleBar = { a: [r3(p.bar.a[0]), r3(p.bar.a[1])], b: [r3(p.bar.b[0]), r3(p.bar.b[1])], lengthMm: PUCK_DIAMETER_MM, widthPx: r3(p.widthPx), frame: seedFrame };
  }
  return { seedFrame, tracks, events, scaleBar, scaleBarNote };
}
