import type { SessionRef } from "@shared/schemas/clips";
import { formatDate } from "@/lib/format";
import { bytesText } from "@shared/bytes";

const whole = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 });
const upTo2 = new Intl.NumberFormat(undefined, { maximumFractionDigits: 2 });

/** "3,200 fps"; 29.97 keeps its decimals. */
export const formatFps = (fps: number | null | undefined) => (fps ? `${fps >= 100 ? whole.format(fps) : upTo2.format(fps)} fps` : "—");
export const formatCount = (n: number | null | undefined) => (n === null || n === undefined ? "—" : whole.format(n));

/** Decimal units, the same text the server's limits use (shared/bytes.ts). */
export const formatBytes = (n: number | null | undefined) => (n === null || n === undefined ? "—" : bytesText(n));

export function sessionLabel(s: Pick<SessionRef, "date" | "venue" | "drill"> | null | undefined): string {
  if (!s) return "No session";
  const date = formatDate(s.date);
  return [date === "—" ? s.date : date, s.venue, s.drill].filter(Boolean).join(" · ");
}

/** Real time between two frames at the capture rate, e.g. "0.31 ms". */
export function formatFrameInterval(captureFps: number): string {
  const ms = 1000 / captureFps;
  return ms < 1 ? `${upTo2.format(ms * 1000)} µs` : `${upTo2.format(ms)} ms`;
}
