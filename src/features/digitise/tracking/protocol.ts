// Messages between the Digitise page and the tracking worker (track.worker.ts).
//
//   page → worker  { type: "start", runId, frames, start, prior?, options }
//                  { type: "cancel", runId }
//   worker → page  { type: "progress", runId, done, total }        after every proposed frame
//                  { type: "proposal", runId, frame, x, y, confidence, sideLobe }
//                  { type: "done", runId, reason, frame, confidence, message, proposals }
//                  { type: "error", runId, message, field? }        bad request or unreadable frame
//
// Frame numbers in marks and proposals are the page's own (those in the frame URLs); pixels are
// the frame's, origin at the top-left corner of the top-left pixel. A new start cancels the run
// before it. Every run ends with exactly one "done" or "error".
import { z } from "zod";
import type { StopReason } from "@shared/tracking/types";

const frameNumber = z.number().int().min(0);
const mark = z.object({ frame: frameNumber, x: z.number(), y: z.number() });

export const framesSpec = z.union([
  z.object({
    /** "{frame}" is replaced by the frame number, "{frame:6}" by it zero-padded to 6 digits. */
    urlTemplate: z.string().regex(/\{frame(:\d{1,2})?\}/, { error: 'urlTemplate must contain "{frame}" or "{frame:N}"' }),
    first: frameNumber,
    last: frameNumber,
  }),
  z.object({ urls: z.array(z.string().min(1)).min(1), first: frameNumber }),
]);

export const trackOptions = z.object({
  direction: z.union([z.literal(1), z.literal(-1)]),
  maxFrames: z.number().int().positive().optional(),
  templateSize: z.number().int().min(8).max(256).optional(),
  threshold: z.number().min(0.05).max(0.99).optional(),
  minPeakMargin: z.number().min(0).max(1).optional(),
  searchRadius: z.number().min(1).max(256).optional(),
  turning: z.boolean().optional(),
  object: z.literal("puck").optional(),
});

export const startMessage = z.object({
  type: z.literal("start"),
  runId: z.number().int(),
  frames: framesSpec,
  start: mark,
  prior: mark.optional(),
  options: trackOptions,
});

export type FramesSpec = z.infer<typeof framesSpec>;
export type WorkerTrackOptions = z.infer<typeof trackOptions>;
export type StartMessage = z.infer<typeof startMessage>;
export type CancelMessage = { type: "cancel"; runId: number };
export type ToWorker = StartMessage | CancelMessage;

export type ProgressMessage = { type: "progress"; runId: number; done: number; total: number };
export type ProposalMessage = { type: "proposal"; runId: number; frame: number; x: number; y: number; confidence: number; sideLobe: number | null };
export type DoneMessage = {
  type: "done";
  runId: number;
  reason: StopReason;
  /** The frame that could not be proposed (page numbering), or null. */
  frame: number | null;
  confidence: number | null;
  message: string;
  proposals: number;
};
export type ErrorMessage = { type: "error"; runId: number; message: string; field?: string };
export type FromWorker = ProgressMessage | ProposalMessage | DoneMessage | ErrorMessage;

/** Frames of the spec, in page numbering (inclusive). */
export function frameRange(spec: FramesSpec): { first: number; last: number } {
  return "urls" in spec ? { first: spec.first, last: spec.first + spec.urls.length - 1 } : { first: spec.first, last: spec.last };
}

export function frameUrl(spec: FramesSpec, frame: number): string {
  if ("urls" in spec) return spec.urls[frame - spec.first];
  return spec.urlTemplate.replace(/\{frame(?::(\d{1,2}))?\}/g, (_, width?: string) => String(frame).padStart(Number(width ?? 0), "0"));
}
