// The theme's colours (src/styles.css) as plain values: SVG presentation attributes, which the
// charts write, do not resolve CSS variables everywhere.
export const chartColors = {
  accent: "#0b6e69",
  accentSoft: "#e1f0ee",
  gold: "#d9a520",
  danger: "#b3261e",
  warn: "#8a5a00",
  ink: "#1b2224",
  inkMuted: "#556064",
  inkFaint: "#7d878a",
  line: "#d9ddd6",
  grid: "#eceee9",
  moment: "#7a3e9d",
  shear: "#1f5fa8",
} as const;

export const axisTick = { fontSize: 12, fill: chartColors.inkMuted } as const;
