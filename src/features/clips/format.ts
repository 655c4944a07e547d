import type { SessionRef } from "@shared/schemas/clips";
import { formatDate } from "@/lib/format";

const whole = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 });
const upTo2 = new Intl.NumberFormat(undefined, { maximumFractionDigits: 2 });

/** "3,200 fps"; 29.97 keeps its decimals. */
export const formatFps = (fps: number | null | undefined) => (fps ? `${fps >= 100 ? whole.format(fps) : upTo2.format(fps)} fps` : "—");
export const formatCount = (n: number | null | undefined) => (n === null || n === undefined ? "—" : whole.format(n));

export function formatBytes(n: number | null | undefined): string {
  if (n === null || n === undefined) return "—";
  if (n >= 1024 ** 3) return `${upTo2.format(n / 1024 ** 3)} GB`;
  if (n >= 1024 ** 2) return `${upTo2.format(n / 1024 ** 2)} MB`;
  if (n >= 1024) return `${whole.format(n / 1024)} KB`;
  return `${n} B`;
}

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
