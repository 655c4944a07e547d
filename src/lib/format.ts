// Dates as people read them, in the browser's locale. Values arrive as ISO strings.

const dateFmt = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short", year: "numeric" });
const dateTimeFmt = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit" });
const relFmt = new Intl.RelativeTimeFormat(undefined, { numeric: "auto" });

const parse = (iso: string | null | undefined) => {
  if (!iso) return null;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
};

export const formatDate = (iso: string | null | undefined) => {
  const d = parse(iso);
  return d ? dateFmt.format(d) : "—";
};

export const formatDateTime = (iso: string | null | undefined) => {
  const d = parse(iso);
  return d ? dateTimeFmt.format(d) : "—";
};

/** "in 3 days", "2 hours ago" — for expiry and recency where the exact time matters less. */
export function formatRelative(iso: string | null | undefined, now: Date = new Date()): string {
  const d = parse(iso);
  if (!d) return "—";
  const s = (d.getTime() - now.getTime()) / 1000;
  const abs = Math.abs(s);
  if (abs < 60) return relFmt.format(Math.round(s), "second");
  if (abs < 3600) return relFmt.format(Math.round(s / 60), "minute");
  if (abs < 86400) return relFmt.format(Math.round(s / 3600), "hour");
  if (abs < 86400 * 30) return relFmt.format(Math.round(s / 86400), "day");
  return dateFmt.format(d);
}
