// Colours of the shot pictures, shared by the readout, side by side and progress. Shot A and B keep
// their colours on every chart and in every table of a comparison.
export const shotColors = {
  puck: "#0b6e69",
  blade: "#c2410c",
  bend: "#5b4bb7",
  a: "#0b6e69",
  b: "#c2410c",
  grid: "#e3e6e0",
  line: "#d9ddd6",
  ink: "#1b2224",
  inkMuted: "#556064",
  event: "#7d878a",
  cursor: "#1b2224",
} as const;

export const axisTick = { fill: shotColors.inkMuted, fontSize: 12 };
