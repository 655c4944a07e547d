import type { Landmark, ShotEventKey } from "@shared/schemas/shots";

// Loadframe's own colours for the Digitise canvas: bright enough to read on ice and boards,
// apart from each other in hue, none of them the accent used for the page's own controls.
export const landmarkColour: Record<Landmark, string> = {
  puck: "#f3c969",
  bladeHeel: "#ff6b4a",
  bladeToe: "#ff9ecb",
  bottomHand: "#4fd6c4",
  topHand: "#7fb3ff",
  buttEnd: "#c6a7ff",
};

/** Short tags drawn next to a mark. */
export const landmarkTag: Record<Landmark, string> = {
  puck: "PK",
  bladeHeel: "HL",
  bladeToe: "TO",
  bottomHand: "BH",
  topHand: "TH",
  buttEnd: "BE",
};

export const eventColour: Record<ShotEventKey, string> = {
  iceStrike: "#8fd3ff",
  puckStrike: "#f3c969",
  peakBend: "#ff6b4a",
  release: "#4fd6c4",
};

export const eventLetter: Record<ShotEventKey, string> = { iceStrike: "I", puckStrike: "P", peakBend: "B", release: "R" };

/** Calibration overlays. */
export const calibrationColour = "#f5f5f0";
export const calibrationDraftColour = "#ffd36b";
