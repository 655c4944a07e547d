// Numbers of the Stick lab as a coach reads them. Flex is the trade's own number (lbf per inch at
// mid-span), so it is shown as it is in either unit system.
const nf = (digits: number) => new Intl.NumberFormat(undefined, { minimumFractionDigits: digits, maximumFractionDigits: digits });

export const formatFlex = (flex: number | null | undefined) => (flex == null || !Number.isFinite(flex) ? "—" : nf(1).format(flex));
/** A printed rating: whole numbers as they are printed on the shaft. */
export const formatRated = (flex: number | null | undefined) => (flex == null ? "—" : Number.isInteger(flex) ? String(flex) : formatFlex(flex));
export const formatPercent = (p: number | null | undefined, digits = 0) => (p == null || !Number.isFinite(p) ? "—" : `${nf(digits).format(p)} %`);
export const formatNumber = (v: number | null | undefined, digits: number) => (v == null || !Number.isFinite(v) ? "—" : nf(digits).format(v));

/** Tone of a % of rated against the team's alert level. */
export const percentTone = (p: number | null | undefined, alert: number) => (p == null ? "neutral" : p < alert ? "warn" : "ok");

const dayFmt = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short", year: "numeric" });
/** A calendar day (YYYY-MM-DD) as people read it, without a time zone moving it a day. */
export const formatDay = (iso: string | null | undefined) => {
  if (!iso) return "—";
  const d = new Date(`${iso.slice(0, 10)}T12:00:00`);
  return Number.isNaN(d.getTime()) ? "—" : dayFmt.format(d);
};
/** Today as YYYY-MM-DD in the viewer's time zone. */
export const todayIso = () => {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
};
