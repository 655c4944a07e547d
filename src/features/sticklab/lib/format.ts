// Numbers of the Stick lab as a coach reads them. Flex is the trade's own number (lbf per inch at
// mid-span), so it is shown as it is in either unit system.
import { formatDate, todayIso } from "@/lib/format";

const nf = (digits: number) => new Intl.NumberFormat(undefined, { minimumFractionDigits: digits, maximumFractionDigits: digits });

export const formatFlex = (flex: number | null | undefined) => (flex == null || !Number.isFinite(flex) ? "—" : nf(1).format(flex));
/** A printed rating: whole numbers as they are printed on the shaft. */
export const formatRated = (flex: number | null | undefined) => (flex == null ? "—" : Number.isInteger(flex) ? String(flex) : formatFlex(flex));
export const formatPercent = (p: number | null | undefined, digits = 0) => (p == null || !Number.isFinite(p) ? "—" : `${nf(digits).format(p)} %`);
export const formatNumber = (v: number | null | undefined, digits: number) => (v == null || !Number.isFinite(v) ? "—" : nf(digits).format(v));

/** Tone of a % of rated against the team's alert level. */
export const percentTone = (p: number | null | undefined, alert: number) => (p == null ? "neutral" : p < alert ? "warn" : "ok");

/** A calendar day (YYYY-MM-DD) as written (src/lib/format.ts says the rule once). */
export { formatDate as formatDay, todayIso };
