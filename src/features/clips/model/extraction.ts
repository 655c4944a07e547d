import type { ClipProgress, ClipStatus, ClipSummary } from "@shared/schemas/clips";

export interface ExtractionView { status: ClipStatus; framesDone: number; frameCount: number | null; failureReason: string | null }

/**
 * What a clip's extraction bar shows. The progress stream's latest event leads while the stored
 * clip still reads "extracting"; once the stored clip has moved on (ready, failed, or extracting
 * again after a retry's refetch), the stored clip wins. The stream is closed as soon as the clip
 * refetches as done, so its last event can be older than the clip: before this rule a refetch that
 * beat the stream's final event left the bar at e.g. "194 of 240" for good.
 */
export function extractionView(clip: Pick<ClipSummary, "status" | "framesDone" | "frameCount" | "failureReason">, live: ClipProgress | null): ExtractionView {
  const own = { status: clip.status, framesDone: clip.framesDone, frameCount: clip.frameCount, failureReason: clip.failureReason };
  if (!live || clip.status !== "extracting") return own;
  // A stream event never moves the count backwards behind what the stored clip already says.
  if (live.status === "extracting" && live.framesDone < clip.framesDone) return own;
  return { status: live.status, framesDone: live.framesDone, frameCount: live.frameCount ?? clip.frameCount, failureReason: live.failureReason };
}

/** 0–1 share of the bar. */
export const extractionShare = (v: ExtractionView) => (v.status === "ready" ? 1 : v.frameCount ? v.framesDone / v.frameCount : 0);
