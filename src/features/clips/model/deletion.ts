import type { ClipDeletionCounts } from "@shared/schemas/clips";

const n = new Intl.NumberFormat("en-US");
const plural = (k: number, one: string, many: string) => `${n.format(k)} ${k === 1 ? one : many}`;

/** What the delete dialog says goes with the clip, counted by the server when the dialog opens. */
export function deletionText(c: ClipDeletionCounts | undefined): string {
  if (!c) return "Counting the shots and marks that go with it… This cannot be undone.";
  const frames = plural(c.frames, "frame", "frames");
  if (c.shots === 0) return `The clip and its ${frames} are removed. No shot has been digitised on it. This cannot be undone.`;
  return `The clip, its ${frames}, ${plural(c.shots, "shot", "shots")} and ${c.marks === 0 ? "their results" : `their ${plural(c.marks, "mark", "marks")} and results`} are removed. This cannot be undone.`;
}
