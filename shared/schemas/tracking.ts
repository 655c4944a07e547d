// The auto-digitise API (docs/api.md, "Tracking"): the analyst's seeds on one frame start a run on
// the job queue; the run's answer holds its progress while it works and its proposals once done.
// Proposals are never marks: the Digitise page shows them apart and the analyst accepts them.
import { z } from "zod";
import { LANDMARKS, type Landmark } from "./shot-document";
import type { ShotEventKey } from "./shots";

const point = z.tuple([z.number({ error: "must be a number" }).finite(), z.number({ error: "must be a number" }).finite()], {
  error: "must be a point [x, y] in frame pixels",
});

export const StartTrackingBody = z.strictObject({
  /** The frame the seeds are placed on (the clip's numbering, the first is 1). */
  seedFrame: z.number({ error: "seedFrame must be a frame number" }).int({ error: "seedFrame must be a whole frame number" }).min(1, { error: "seedFrame must be 1 or more" }),
  seeds: z
    .partialRecord(z.enum(LANDMARKS, { error: `seeds: landmarks are ${LANDMARKS.join(", ")}` }), point)
    .refine((s) => Object.keys(s).length > 0, { error: "place at least one landmark on the seed frame" }),
});
export type StartTrackingBody = { seedFrame: number; seeds: Partial<Record<Landmark, [number, number]>> };

export type TrackingStatus = "queued" | "running" | "done" | "failed" | "cancelled";
export type TrackingPhase = "decoding" | "tracking" | "events";

export type StopReason = "low-confidence" | "ambiguous" | "left-frame" | "end-of-range" | "cancelled";

export interface TrackStopInfo {
  reason: StopReason;
  /** The first frame not proposed; null when the run reached the shot's end. */
  frame: number | null;
  message: string;
}

/** [frame, x, y, confidence]: frame pixels, confidence the match score 0…1. */
export type ProposedMark = [frame: number, x: number, y: number, confidence: number];

export interface ProposedTrack {
  marks: ProposedMark[];
  forward: TrackStopInfo;
  backward: TrackStopInfo;
}

export interface ProposedEvent {
  frame: number;
  confidence: number;
  evidence: string;
}

export interface ProposedScaleBar {
  a: [number, number];
  b: [number, number];
  lengthMm: number;
  /** The puck's length seen side-on, px, and the frame it was measured on. */
  widthPx: number;
  frame: number;
}

export interface TrackingProposals {
  seedFrame: number;
  tracks: Partial<Record<Landmark, ProposedTrack>>;
  events: Partial<Record<ShotEventKey, ProposedEvent>>;
  /** From the puck at rest, when the clip has no calibration and the puck was clearly found. */
  scaleBar: ProposedScaleBar | null;
  /** Why no scale bar was proposed, when the clip needs one. */
  scaleBarNote: string | null;
}

export interface TrackingRun {
  id: string;
  shotId: string;
  status: TrackingStatus;
  phase: TrackingPhase | null;
  /** Landmark-frames done out of total (0 / 0 while decoding starts). */
  done: number;
  total: number;
  seedFrame: number;
  seeds: Partial<Record<Landmark, [number, number]>>;
  failureReason: string | null;
  requestedByName: string | null;
  createdAt: string;
  finishedAt: string | null;
  proposals: TrackingProposals | null;
}

/** GET …/tracking: the shot's latest run, or none yet. */
export interface TrackingAnswer {
  run: TrackingRun | null;
}
