import { CartesianGrid, ComposedChart, Label, Legend, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import type { BenchTestRow } from "@shared/schemas/sticks";
import { axisTick, chartColors } from "../lib/chart-colors";
import { formatDay, formatFlex, formatRated } from "../lib/format";
import { dayValue } from "@/lib/format";

interface Props {
  tests: readonly BenchTestRow[];
  shotsByDate: readonly { date: string; count: number }[];
  ratedFlex: number | null;
  alertPercent: number;
  height?: number;
}

const day = dayValue;
const shortDate = new Intl.DateTimeFormat(undefined, { day: "numeric", month: "short" });

/** Measured flex test by test against the rating and the team's alert line; shots taken per day below. */
export function HistoryChart({ tests, shotsByDate, ratedFlex, alertPercent, height = 320 }: Props) {
  const flex = tests.map((t) => ({ t: day(t.testedOn), flex: t.fit.measuredFlex, date: t.testedOn }));
  const shots = shotsByDate.map((s) => ({ t: day(s.date), shots: s.count, date: s.date }));
  const alertFlex = ratedFlex ? (ratedFlex * alertPercent) / 100 : null;
  const values = [...flex.map((f) => f.flex), ...(ratedFlex ? [ratedFlex] : []), ...(alertFlex ? [alertFlex] : [])];
  const lo = Math.floor((Math.min(...values) - 4) / 5) * 5;
  const hi = Math.ceil((Math.max(...values) + 3) / 5) * 5;
  const times = [...flex, ...shots].map((p) => p.t);
  const pad = 4 * 86_400_000;
  const maxShots = Math.max(1, ...shots.map((s) => s.shots));
  // Ticks on the test days (thinned to about eight), so each dot has its date under it.
  const testDays = [...new Set(flex.map((f) => f.t))];
  const every = Math.ceil(testDays.length / 8);
  const ticks = (testDays.length ? testDays : times).filter((_, i, all) => i % every === 0 || i === all.length - 1);
  return (
    <div style={{ height }} role="img" aria-label={`Measured flex over ${tests.length} bench tests${ratedFlex ? `, rated ${ratedFlex}` : ""}`}>
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart margin={{ top: 8, right: 12, bottom: 8, left: 4 }}>
          <CartesianGrid stroke={chartColors.grid} />
          <XAxis
            type="number"
            dataKey="t"
            scale="time"
            ticks={ticks}
            domain={[Math.min(...times) - pad, Math.max(...times) + pad]}
            tick={axisTick}
            tickFormatter={(t: number) => shortDate.format(new Date(t))}
          />
          <YAxis yAxisId="flex" domain={[lo, hi]} ticks={Array.from({ length: (hi - lo) / 5 + 1 }, (_, i) => lo + 5 * i)} tick={axisTick} width={48}>
            <Label value="Flex" angle={-90} position="insideLeft" offset={8} fill={chartColors.inkMuted} fontSize={12} style={{ textAnchor: "middle" }} />
          </YAxis>
          <YAxis yAxisId="shots" orientation="right" domain={[0, maxShots * 3]} hide />
          <Tooltip
            labelFormatter={(t) => formatDay(new Date(Number(t)).toISOString())}
            formatter={(v, name) => (name === "Shots taken" ? [`${v}`, name] : [formatFlex(Number(v)), name])}
            contentStyle={{ borderRadius: 8, borderColor: chartColors.line, fontSize: 13 }}
          />
          <Legend verticalAlign="top" height={28} iconSize={10} wrapperStyle={{ fontSize: 13 }} />
          {ratedFlex && (
            <ReferenceLine yAxisId="flex" y={ratedFlex} stroke={chartColors.inkMuted} strokeDasharray="6 4">
              <Label value={`Rated ${formatRated(ratedFlex)}`} position="insideTopRight" fill={chartColors.inkMuted} fontSize={12} />
            </ReferenceLine>
          )}
          {alertFlex && <ReferenceArea yAxisId="flex" y1={lo} y2={alertFlex} fill="#fbf0d9" fillOpacity={0.7} ifOverflow="hidden" />}
          {alertFlex && (
            <ReferenceLine yAxisId="flex" y={alertFlex} stroke={chartColors.warn} strokeDasharray="3 3">
              <Label value={`Alert: ${alertPercent} % of rated = ${formatFlex(alertFlex)} flex`} position="insideBottomLeft" fill={chartColors.warn} fontSize={12} />
            </ReferenceLine>
          )}
          {/* Shots per day as stems from the floor (a bar series would turn the time axis into categories). */}
          {shots.map((s) => (
            <ReferenceLine key={s.t} yAxisId="shots" segment={[{ x: s.t, y: 0 }, { x: s.t, y: s.shots }]} stroke={chartColors.gold} strokeWidth={5} />
          ))}
          {shots.length > 0 && <Scatter yAxisId="shots" data={shots} dataKey="shots" name="Shots taken" fill={chartColors.gold} shape="diamond" isAnimationActive={false} />}
          <Line
            yAxisId="flex"
            data={flex}
            dataKey="flex"
            name="Measured flex"
            stroke={chartColors.accent}
            strokeWidth={2.5}
            dot={{ r: 4, fill: chartColors.accent }}
            isAnimationActive={false}
          />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}
