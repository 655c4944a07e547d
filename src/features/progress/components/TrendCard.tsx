import { useNavigate } from "react-router-dom";
import { CartesianGrid, ComposedChart, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { axisTick, shotColors } from "@/components/shot/colors";
import { roundTicksWithin } from "@/components/shot/series";
import { dayValue, formatDate } from "@/lib/format";
import { convert, digitsOf, formatValue, unitOf, type MetricDef, type MetricSummary, type ProgressPoint } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";

interface Props {
  def: MetricDef;
  points: ProgressPoint[];
  summary: MetricSummary;
  units: UnitSystem;
}

const day = dayValue;
const short = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short" });

function median(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** One result over time: every shot as a dot, the session's median as the line, best and typical beside it. */
export function TrendCard({ def, points, summary, units }: Props) {
  const navigate = useNavigate();
  const show = (si: number) => convert(def.kind, si, units);
  const have = points.filter((p) => p.values[def.key]);
  const dots = have.map((p) => ({ t: day(p.date), v: show(p.values[def.key]!.value), shotId: p.shotId, label: p.label, date: p.date }));
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
  const ts = dots.map((x) => x.t);
  const vs = dots.map((x) => x.v);
  // A little room above and below the dots, and round ticks inside it.
  const span = Math.max(...vs) - Math.min(...vs) || Math.abs(vs[0] ?? 1) * 0.1 || 1;
  const yDomain: [number, number] = [Math.min(...vs) - span * 0.15, Math.max(...vs) + span * 0.15];
  const pad = 3 * 86_400_000;

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
      {dots.length ? (
        <div style={{ height: 200 }} className="mt-3" role="img" aria-label={`${def.label} per shot over time, in ${unit}`}>
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart margin={{ top: 8, right: 12, bottom: 0, left: 0 }}>
              <CartesianGrid stroke={shotColors.grid} />
              <XAxis type="number" dataKey="t" scale="time" domain={[Math.min(...ts) - pad, Math.max(...ts) + pad]} tick={axisTick} tickFormatter={(t: number) => short.format(new Date(t))} />
              <YAxis type="number" dataKey="v" tick={axisTick} width={48} domain={yDomain} ticks={roundTicksWithin(yDomain[0], yDomain[1], 4)} tickFormatter={(v: number) => v.toFixed(d > 0 && Math.abs(v) < 10 ? 1 : 0)} />
              <Tooltip
                isAnimationActive={false}
                labelFormatter={(t) => formatDate(new Date(Number(t)).toISOString())}
                formatter={(v, name) => [`${Number(v).toFixed(d)}${unit === "°" ? "°" : ` ${unit}`}`, name === "v" ? def.label : name]}
                contentStyle={{ borderRadius: 8, borderColor: shotColors.line, fontSize: 13 }}
              />
              <Line data={line} dataKey="v" name="Session median" stroke={shotColors.a} strokeWidth={2} dot={false} isAnimationActive={false} />
              <Scatter
                data={dots}
                dataKey="v"
                name="Shot"
                fill={shotColors.b}
                isAnimationActive={false}
                cursor="pointer"
                onClick={(p) => {
                  const id = (p as { payload?: { shotId?: string } }).payload?.shotId;
                  if (id) navigate(`/readout/${id}`);
                }}
              />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
      ) : (
        <p className="mt-4 text-sm text-ink-muted">No shot has this result yet.</p>
      )}
    </section>
  );
}
