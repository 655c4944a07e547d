// Dates as people read them, in the browser's locale. Values arrive as ISO strings of two kinds:
// calendar dates (YYYY-MM-DD: a session's date, a bench test's day) are shown exactly as written,
// never as a UTC midnight moved into the viewer's zone (a day early west of UTC); instants (with a
// time: uploaded at, saved at) are shown in the viewer's zone.

const dateFmt = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short", year: "numeric" });
const dateTimeFmt = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit" });
const relFmt = new Intl.RelativeTimeFormat(undefined, { numeric: "auto" });

const CALENDAR_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

const parse = (iso: string | null | undefined) => {
  if (!iso) return null;
  const day = CALENDAR_DATE.exec(iso);
  // A calendar date: that day in the viewer's zone (noon, clear of any daylight-saving change).
  const d = day ? new Date(Number(day[1]), Number(day[2]) - 1, Number(day[3]), 12) : new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
};

/** A calendar date as a number for a time axis (its local noon); formatDate shows the same day back. */
export const dayValue = (iso: string) => parse(iso.slice(0, 10))?.getTime() ?? Number.NaN;

/** Today as YYYY-MM-DD in the viewer's own zone. */
export const todayIso = () => {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
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
