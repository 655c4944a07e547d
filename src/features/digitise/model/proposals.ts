import { LANDMARKS, type Landmark, type Mark, type ShotEventKey, type ShotEventsDraft, type ShotMarks } from "@shared/schemas/shots";
import type { TrackingProposals } from "@shared/schemas/tracking";
import { markAt } from "./tracks";

// What accepting a tracking run's proposals does to the document, as pure functions: proposed
// marks only fill frames the analyst has not marked (an analyst's mark is never overwritten), and a
// proposed event only fills an event the analyst has not set.

export interface AcceptScope {
  /** Only these landmarks (default: all proposed). */
  landmarks?: readonly Landmark[];
  /** Only proposals on frames up to and including this one. */
  upTo?: number;
  /** Take the proposed events too (default true). */
  events?: boolean;
}

export interface Acceptance {
  /** Marks to add per landmark (frames the analyst had not marked). */
  marks: Partial<Record<Landmark, Mark[]>>;
  events: Partial<Record<ShotEventKey, number>>;
  added: number;
  /** Proposed marks left out because the analyst already marked that frame. */
  keptAnalyst: number;
}

export function acceptance(p: TrackingProposals, doc: { marks: ShotMarks; events: ShotEventsDraft }, scope: AcceptScope = {}): Acceptance {
  const out: Acceptance = { marks: {}, events: {}, added: 0, keptAnalyst: 0 };
  const upTo = scope.upTo ?? Infinity;
  for (const k of scope.landmarks ?? LANDMARKS) {
    const t = p.tracks[k];
    if (!t) continue;
    const add: Mark[] = [];
    for (const [f, x, y] of t.marks) {
      if (f > upTo) continue;
      if (markAt(doc.marks[k], f)) out.keptAnalyst++;
      else add.push([f, x, y]);
    }
    if (add.length) out.marks[k] = add;
    out.added += add.length;
  }
  if (scope.events !== false)
    for (const [k, e] of Object.entries(p.events) as [ShotEventKey, { frame: number }][])
      if (e && e.frame <= upTo && doc.events[k] === undefined) out.events[k] = e.frame;
  return out;
}

/** Proposed marks on one frame that are not yet in the document, for the overlay. */
export function pendingAt(p: TrackingProposals, marks: ShotMarks, frame: number): { landmark: Landmark; x: number; y: number; confidence: number }[] {
  const out: { landmark: Landmark; x: number; y: number; confidence: number }[] = [];
  for (const k of LANDMARKS) {
    const m = p.tracks[k]?.marks.find((q) => q[0] === frame);
    if (m && !markAt(marks[k], frame)) out.push({ landmark: k, x: m[1], y: m[2], confidence: m[3] });
  }
  return out;
}

/** Proposed marks of a landmark still to accept. */
export function pendingCount(p: TrackingProposals, marks: ShotMarks, k: Landmark): number {
  return p.tracks[k]?.marks.filter((m) => !markAt(marks[k], m[0])).length ?? 0;
}
