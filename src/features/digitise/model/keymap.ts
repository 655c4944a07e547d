import { LANDMARKS, type Landmark, type ShotEventKey } from "@shared/schemas/shots";
import { frameBindings, plainKey, type FrameCommand, type KeyLike } from "@/components/shot/stepping/frame-keys";

// Loadframe's own key map for the Digitise page. One table drives both the key handler and the
// help overlay, so the overlay can never list a key that does nothing (or miss one that does).

export type { KeyLike };
export type Command =
  | FrameCommand | "jump" | "prevMark" | "nextMark"
  | "play" | "playBack" | "slower" | "faster"
  | `landmark:${Landmark}` | "nextLandmark" | "prevLandmark" | "deleteMark" | "toggleVisible" | "showAll" | "trail" | "autoAdvance" | "track"
  | `event:${ShotEventKey}` | `gotoEvent:${ShotEventKey}`
  | "zoomIn" | "zoomOut" | "fit" | "original"
  | "toolMark" | "toolScaleBar" | "toolPlane" | "escape"
  | "undo" | "redo" | "help";

export interface Binding {
  command: Command;
  /** As shown in the help overlay. */
  keys: string[];
  group: "Frames" | "Playback" | "Landmarks" | "Events" | "View" | "Tools" | "Editing";
  description: string;
  /** Works on a read-only shot too. */
  viewing?: boolean;
  match: (e: KeyLike) => boolean;
}

const mod = (e: KeyLike) => !!(e.ctrlKey || e.metaKey);
const plain = plainKey;
const letter = (e: KeyLike, l: string) => e.key.toLowerCase() === l && plain(e);
const only = (e: KeyLike, l: string) => letter(e, l) && !e.shiftKey;
const shifted = (e: KeyLike, l: string) => letter(e, l) && !!e.shiftKey;

const EVENT_KEYS: [ShotEventKey, string, string][] = [
  ["iceStrike", "i", "ice strike"],
  ["puckStrike", "p", "puck strike"],
  ["peakBend", "b", "peak bend"],
  ["release", "r", "release"],
];

export const bindings: Binding[] = [
  // Stepping keys are shared with the Clip page (the same table drives both).
  ...frameBindings.map((b): Binding => ({ ...b, group: "Frames", viewing: true, description: b.command === "first" || b.command === "last" ? `${b.description} of the shot` : b.description })),
  { command: "jump", keys: ["G"], group: "Frames", description: "Go to a frame number", viewing: true, match: (e) => only(e, "g") },
  { command: "prevMark", keys: ["["], group: "Frames", description: "Previous frame marked for the active landmark", viewing: true, match: (e) => e.key === "[" && plain(e) },
  { command: "nextMark", keys: ["]"], group: "Frames", description: "Next frame marked for the active landmark", viewing: true, match: (e) => e.key === "]" && plain(e) },

  { command: "play", keys: ["Space"], group: "Playback", description: "Play forward / pause", viewing: true, match: (e) => e.key === " " && !e.shiftKey && plain(e) },
  { command: "playBack", keys: ["Shift", "Space"], group: "Playback", description: "Play backward / pause", viewing: true, match: (e) => e.key === " " && !!e.shiftKey && plain(e) },
  { command: "slower", keys: [","], group: "Playback", description: "Slower (a smaller fraction of real time)", viewing: true, match: (e) => e.key === "," && plain(e) },
  { command: "faster", keys: ["."], group: "Playback", description: "Faster", viewing: true, match: (e) => e.key === "." && plain(e) },

  ...LANDMARKS.map((l, i): Binding => ({
    command: `landmark:${l}`, keys: [String(i + 1)], group: "Landmarks", description: `Pick landmark ${i + 1}`, viewing: true,
    match: (e) => (e.code === `Digit${i + 1}` || e.code === `Numpad${i + 1}` || e.key === String(i + 1)) && !e.shiftKey && plain(e),
  })),
  { command: "nextLandmark", keys: ["N"], group: "Landmarks", description: "Next landmark", viewing: true, match: (e) => only(e, "n") },
  { command: "prevLandmark", keys: ["Shift", "N"], group: "Landmarks", description: "Previous landmark", viewing: true, match: (e) => shifted(e, "n") },
  { command: "deleteMark", keys: ["Delete"], group: "Landmarks", description: "Delete the active landmark's mark on this frame (also Backspace)", match: (e) => (e.key === "Delete" || e.key === "Backspace") && plain(e) },
  { command: "toggleVisible", keys: ["H"], group: "Landmarks", description: "Hide / show the active landmark", viewing: true, match: (e) => only(e, "h") },
  { command: "showAll", keys: ["Shift", "H"], group: "Landmarks", description: "Show every landmark", viewing: true, match: (e) => shifted(e, "h") },
  { command: "trail", keys: ["V"], group: "Landmarks", description: "Trail of past marks: off, 5, 15, 40", viewing: true, match: (e) => only(e, "v") },
  { command: "autoAdvance", keys: ["A"], group: "Landmarks", description: "Auto-advance to the next frame after each click", match: (e) => only(e, "a") },
  { command: "track", keys: ["T"], group: "Landmarks", description: "Track the active landmark forward (tracking assist)", match: (e) => only(e, "t") },

  ...EVENT_KEYS.map(([k, l, name]): Binding => ({
    command: `event:${k}`, keys: [l.toUpperCase()], group: "Events", description: `Set ${name} to this frame (again clears it)`, match: (e) => only(e, l),
  })),
  ...EVENT_KEYS.map(([k, l, name]): Binding => ({
    command: `gotoEvent:${k}`, keys: ["Shift", l.toUpperCase()], group: "Events", description: `Go to ${name}`, viewing: true, match: (e) => shifted(e, l),
  })),

  { command: "zoomIn", keys: ["+"], group: "View", description: "Zoom in at the centre (the wheel zooms at the pointer)", viewing: true, match: (e) => (e.key === "+" || e.key === "=") && plain(e) },
  { command: "zoomOut", keys: ["−"], group: "View", description: "Zoom out", viewing: true, match: (e) => (e.key === "-" || e.key === "_") && plain(e) },
  { command: "fit", keys: ["F"], group: "View", description: "Fit the frame to the view", viewing: true, match: (e) => only(e, "f") },
  { command: "original", keys: ["O"], group: "View", description: "Original pixels: one frame pixel per screen pixel", viewing: true, match: (e) => only(e, "o") },

  { command: "toolMark", keys: ["M"], group: "Tools", description: "Mark landmarks (click places, drag a mark to correct it, drag empty picture to pan)", match: (e) => only(e, "m") },
  { command: "toolScaleBar", keys: ["S"], group: "Tools", description: "Scale bar: click both ends of a known length", match: (e) => only(e, "s") },
  { command: "toolPlane", keys: ["L"], group: "Tools", description: "Plane layout: click 4 or more points of known position", match: (e) => only(e, "l") },
  { command: "escape", keys: ["Esc"], group: "Tools", description: "Back to marking; close this help", viewing: true, match: (e) => e.key === "Escape" },

  { command: "undo", keys: ["Ctrl", "Z"], group: "Editing", description: "Undo (⌘ on a Mac)", match: (e) => mod(e) && !e.shiftKey && e.key.toLowerCase() === "z" },
  { command: "redo", keys: ["Ctrl", "Shift", "Z"], group: "Editing", description: "Redo (also Ctrl + Y)", match: (e) => mod(e) && ((e.shiftKey && e.key.toLowerCase() === "z") || e.key.toLowerCase() === "y") },
  { command: "help", keys: ["?"], group: "Editing", description: "Show / hide this list of keys", viewing: true, match: (e) => e.key === "?" && !mod(e) },
];

/** The command for a key press, or null; on a read-only shot only viewing commands answer. */
export function commandFor(e: KeyLike, readOnly = false): Command | null {
  for (const b of bindings) if (b.match(e) && (!readOnly || b.viewing)) return b.command;
  return null;
}

/** True when the key press comes from a field the analyst is typing into. */
export function isTypingTarget(target: { tagName?: string; isContentEditable?: boolean; type?: string } | null): boolean {
  if (!target?.tagName) return false;
  const tag = target.tagName.toLowerCase();
  if (target.isContentEditable) return true;
  if (tag === "textarea" || tag === "select") return true;
  return tag === "input" && !["checkbox", "radio", "button", "range"].includes(target.type ?? "text");
}
