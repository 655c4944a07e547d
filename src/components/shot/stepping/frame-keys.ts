// The keys that move between frames, one table for every page that steps through a clip (the
// Digitise page adds its own commands around these; its help overlay lists them from there).

export interface KeyLike {
  key: string;
  code?: string;
  shiftKey?: boolean;
  ctrlKey?: boolean;
  metaKey?: boolean;
  altKey?: boolean;
}

export type FrameCommand = "prev" | "next" | "prev10" | "next10" | "first" | "last";

export const plainKey = (e: KeyLike) => !(e.ctrlKey || e.metaKey) && !e.altKey;

export const frameBindings: { command: FrameCommand; keys: string[]; description: string; match: (e: KeyLike) => boolean }[] = [
  { command: "prev", keys: ["←"], description: "Previous frame", match: (e) => e.key === "ArrowLeft" && !e.shiftKey && plainKey(e) },
  { command: "next", keys: ["→"], description: "Next frame", match: (e) => e.key === "ArrowRight" && !e.shiftKey && plainKey(e) },
  { command: "prev10", keys: ["Shift", "←"], description: "Back 10 frames", match: (e) => e.key === "ArrowLeft" && !!e.shiftKey && plainKey(e) },
  { command: "next10", keys: ["Shift", "→"], description: "Forward 10 frames", match: (e) => e.key === "ArrowRight" && !!e.shiftKey && plainKey(e) },
  { command: "first", keys: ["Home"], description: "First frame", match: (e) => e.key === "Home" && plainKey(e) },
  { command: "last", keys: ["End"], description: "Last frame", match: (e) => e.key === "End" && plainKey(e) },
];

const FRAME_COMMANDS = new Set<string>(frameBindings.map((b) => b.command));
export const isFrameCommand = (c: string): c is FrameCommand => FRAME_COMMANDS.has(c);

export const frameCommandFor = (e: KeyLike): FrameCommand | null => frameBindings.find((b) => b.match(e))?.command ?? null;

/** Carry out a frame command on anything that steps (the shared stepper, the Digitise store). */
export function runFrameCommand(c: FrameCommand, s: { stepBy(d: number): void; goto(f: number): void }, range: { first: number; last: number }) {
  const moves: Record<FrameCommand, () => void> = {
    prev: () => s.stepBy(-1),
    next: () => s.stepBy(1),
    prev10: () => s.stepBy(-10),
    next10: () => s.stepBy(10),
    first: () => s.goto(range.first),
    last: () => s.goto(range.last),
  };
  moves[c]();
}
