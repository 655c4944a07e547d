// Renders a clip once per test file and tracks it from its first (or last) frame's true position.
import { track } from "../../../../shared/tracking/track";
import type { TrackOptions } from "../../../../shared/tracking/types";
import { errorStats } from "./metrics";
import { memorySource, renderGray, type ClipSpec } from "./synthetic-clips";

const rendered = new Map<string, ReturnType<typeof renderGray>>();

export function framesOf(spec: ClipSpec) {
  if (!rendered.has(spec.graph)) rendered.set(spec.graph, renderGray(spec));
  return rendered.get(spec.graph)!;
}

export async function trackClip(spec: ClipSpec, options: Partial<TrackOptions> = {}) {
  const frames = await framesOf(spec);
  const direction = options.direction ?? 1;
  const from = direction === 1 ? 0 : frames.length - 1;
  const result = await track({ ...options, frames: memorySource(frames), start: { frame: from, ...spec.truth(from) }, direction });
  return { result, stats: errorStats(result.proposals, spec.truth) };
}
