import { useNavigate } from "react-router-dom";
import { CartesianGrid, ComposedChart, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { axisTick, shotColors } from "@/components/shot/colors";
import { roundTicksWithin } from "@/components/shot/series";
import { dayValue, formatDate } from "@/lib/format";
import { Link } from "react-router-dom";
import { SHOT_TYPES, convert, digitsOf, formatValue, shotTypeLabels, unitOf, type MetricDef, type MetricSummary, type ProgressPoint, type ShotType } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";

interface Props {
  def: MetricDef;
  points: ProgressPoint[];
  summary: MetricSummary;
  units: UnitSystem;
  /** Every shot type is shown: dots coloured by type, with a key. */
  byType?: boolean;
}

/** A colour per shot type, apart from the session line's. */
export const typeColors: Record<ShotType, string> = { slap: shotColors.b, wrist: shotColors.bend, snap: "#a16207", backhand: "#1d4ed8" };
const APART_COLOR = "#8a9396";

const day = dayValue;
const short = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short" });

function median(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** One result over time: every shot as a dot, the session's median as the line, best and typical beside it. */
export function TrendCard({ def, points, summary, units, byType = false }: Props) {
  const navigate = useNavigate();
  const show = (si: number) => convert(def.kind, si, units);
  const all = points.filter((p) => p.values[def.key]);
  const apart = all.filter((p) => p.values[def.key]!.apart);
  // Values the engine questioned stay on the chart (hollow, grey) but out of the line, best and typical.
  const have = all.filter((p) => !p.values[def.key]!.apart);
  const dotOf = (p: ProgressPoint) => ({ t: day(p.date), v: show(p.values[def.key]!.value), shotId: p.shotId, label: p.label, date: p.date, shotType: p.shotType });
  const dots = have.map(dotOf);
  const apartDots = apart.map(dotOf);
  const sessions = new Map<string, { t: number; vals: number[] }>();
  for (const p of have) {
    const k = p.sessionId ?? p.date;
    const s = sessions.get(k) ?? { t: day(p.date), vals: [] };
    s.vals.push(show(p.values[def.key]!.value));
    sessions.set(k, s);
  }
  const line = [...sessions.values()].map((s) => ({ t: s.t, v: median(s.vals) })).sort((a, b) => a.t - b.t);
  const unit = unitOf(def.kind, units);
  const d = digitsOf(def.kind, units);
  const change = summary.firstSession !== null && summary.lastSession !== null ? show(summary.lastSession) - show(summary.firstSession) : null;
  const ts = [...dots, ...apartDots].map((x) => x.t);
  const vs = [...dots, ...apartDots].map((x) => x.v);
  // One tick per session day (at most six), so no date label repeats.
  const days = [...new Set(ts)].sort((a, b) => a - b);
  const xTicks = days.length <= 6 ? days : days.filter((_, i) => i % Math.ceil(days.length / 6) === 0);
  const typesShown = SHOT_TYPES.filter((t) => dots.some((x) => x.shotType === t));
  const open = (p: unknown) => {
    const id = (p as { payload?: { shotId?: string } }).payload?.shotId;
    if (id) navigate(`/readout/${id}`);
  };
  // A little room above and below the dots, and round ticks inside it.
  const span = Math.max(...vs) - Math.min(...vs) || Math.abs(vs[0] ?? 1) * 0.1 || 1;
  const yDomain: [number, number] = [Math.min(...vs) - span * 0.15, Math.max(...vs) + span * 0.15];
  const pad = 3 * 86_400_000;
  // As many decimals as the tick step needs, so no two labels read the same.
  const yTicks = roundTicksWithin(yDomain[0], yDomain[1], 4);
  const yStep = yTicks.length > 1 ? Math.abs(yTicks[1] - yTicks[0]) : 1;
  const yDigits = Math.min(3, Math.max(0, Math.ceil(-Math.log10(yStep) - 1e-9)));

  return (
    <section className="rounded-[var(--radius-card)] border border-line bg-surface p-5 shadow-[var(--shadow-card)]" data-testid={`trend-${def.key}`}>
      <header className="flex flex-col gap-2">
        <div>
          <h2 className="text-base font-semibold text-ink">{def.label}</h2>
          <p className="text-sm text-ink-muted">
            {summary.count} shot{summary.count === 1 ? "" : "s"}
            {change !== null && (
              <>
                {" · "}
                <span className="font-medium text-ink">
                  {change > 0 ? "+" : change < 0 ? "−" : "±"}
                  {Math.abs(change).toFixed(d)}
                  {unit === "°" ? "°" : ` ${unit}`}
                </span>{" "}
                since the first session (typical values)
              </>
            )}
          </p>
        </div>
        <dl className="flex gap-6">
          <div>
            <dt className="text-xs font-medium tracking-wide text-ink-muted uppercase">{def.bestLabel}</dt>
            <dd className="text-xl font-semibold text-ink tabular-nums" data-role="best">
              {formatValue(def.kind, summary.best, units)}
            </dd>
          </div>
          <div>
            <dt className="text-xs font-medium tracking-wide text-ink-muted uppercase">Typical</dt>
            <dd className="text-xl font-semibold text-ink tabular-nums" data-role="typical">
              {formatValue(def.kind, summary.typical, units)}
            </dd>
          </div>
        </dl>
      </header>
      {byType && typesShown.length > 1 && (
        <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-muted" aria-label="Dot colours">
          {typesShown.map((t) => (
            <li key={t} className="flex items-center gap-1.5">
              <span aria-hidden className="inline-block size-2.5 rounded-full" style={{ background: typeColors[t] }} />
              {shotTypeLabels[t]}
            </li>
          ))}
        </ul>
      )}
      {dots.length || apartDots.length ? (
        <div style={{ height: 200 }} className="mt-3" role="img" aria-label={`${def.label} per shot over time, in ${unit}`}>
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart margin={{ top: 8, right: 12, bottom: 0, left: 0 }}>
              <CartesianGrid stroke={shotColors.grid} />
              <XAxis type="number" dataKey="t" scale="time" domain={[Math.min(...ts) - pad, Math.max(...ts) + pad]} ticks={xTicks} tick={axisTick} tickFormatter={(t: number) => short.format(new Date(t))} />
              <YAxis type="number" dataKey="v" tick={axisTick} width={48} domain={yDomain} ticks={yTicks} tickFormatter={(v: number) => v.toFixed(yDigits)} />
              <Tooltip
                isAnimationActive={false}
                labelFormatter={(t) => formatDate(new Date(Number(t)).toISOString())}
                formatter={(v, name) => [`${Number(v).toFixed(d)}${unit === "°" ? "°" : ` ${unit}`}`, name === "v" ? def.label : name]}
                contentStyle={{ borderRadius: 8, borderColor: shotColors.line, fontSize: 13 }}
              />
              <Line data={line} dataKey="v" name="Session median" stroke={shotColors.a} strokeWidth={2} dot={false} isAnimationActive={false} />
              {(byType ? typesShown : [null]).map((t) => (
                <Scatter
                  key={t ?? "all"}
                  data={t ? dots.filter((x) => x.shotType === t) : dots}
                  dataKey="v"
                  name={t ? shotTypeLabels[t] : "Shot"}
                  fill={t ? typeColors[t] : shotColors.b}
                  isAnimationActive={false}
                  cursor="pointer"
                  onClick={open}
                />
              ))}
              {apartDots.length > 0 && (
                <Scatter data={apartDots} dataKey="v" name="Set apart" fill="#ffffff" stroke={APART_COLOR} strokeWidth={1.5} isAnimationActive={false} cursor="pointer" onClick={open} />
              )}
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      ) : (
        <p className="mt-4 text-sm text-ink-muted">No shot has this result yet.</p>
      )}
      {apart.length > 0 && (
        <div className="mt-3 rounded-md border border-line bg-sunken px-3 py-2 text-sm" data-testid={`apart-${def.key}`}>
          <p className="font-medium text-ink">
            {apart.length} result{apart.length === 1 ? "" : "s"} set apart (hollow dots): not counted in {def.bestLabel.toLowerCase()} or typical
          </p>
          <ul className="mt-1 space-y-0.5 text-ink-muted">
            {apart.slice(0, 3).map((p) => (
              <li key={p.shotId}>
                <Link to={`/readout/${p.shotId}`} className="text-accent hover:underline">
                  {p.label || shotTypeLabels[p.shotType]} · {formatDate(p.date)}
                </Link>
                {" — "}
                {formatValue(def.kind, p.values[def.key]!.value, units)}: {p.values[def.key]!.apart}
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
