import { EVENTS, LANDMARKS, type Landmark, type ShotEventKey } from "@shared/schemas/shots";
import type { MarksContent } from "./autosave";

// Three-way merge of a shot's marks, per landmark track and per event: the version both edits
// started from (base), ours (mine) and the one saved meanwhile (theirs). A part only one side
// changed takes that side; a part both changed the same way is fine; a part both changed
// differently overlaps, and only the analyst decides it — never silently.

export type MergePart = Landmark | ShotEventKey;

/** An empty track and no track are the same thing. */
const norm = (v: unknown) => (v === undefined || (Array.isArray(v) && v.length === 0) ? null : v);
const same = (a: unknown, b: unknown) => JSON.stringify(norm(a)) === JSON.stringify(norm(b));

export interface Merge {
  /** Every part merged; an overlapping part takes `onOverlap`'s side. */
  content: MarksContent;
  /** Parts both sides changed differently. */
  overlaps: MergePart[];
  /** Parts only the other side changed (kept from theirs). */
  theirsOnly: MergePart[];
}

export function mergeMarks(base: MarksContent, mine: MarksContent, theirs: MarksContent, onOverlap: "mine" | "theirs" = "theirs"): Merge {
  const content: MarksContent = { marks: {}, events: {} };
  const overlaps: MergePart[] = [];
  const theirsOnly: MergePart[] = [];
  const pick = <T>(part: MergePart, b: T, m: T, t: T): T => {
    if (same(m, t) || same(t, b)) return m;
    if (same(m, b)) {
      theirsOnly.push(part);
      return t;
    }
    overlaps.push(part);
    return onOverlap === "mine" ? m : t;
  };
  for (const l of LANDMARKS) {
    const track = pick(l, base.marks[l], mine.marks[l], theirs.marks[l]);
    if (track?.length) content.marks[l] = track;
  }
  for (const e of EVENTS) {
    const frame = pick(e, base.events[e], mine.events[e], theirs.events[e]);
    if (frame !== undefined) content.events[e] = frame;
  }
  return { content, overlaps, theirsOnly };
}
