import { Bar, BarChart, CartesianGrid, Cell, Label, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { BenchFit } from "@shared/mechanics/sticklab";
import { benchUnits, loadFromN, type BenchUnits } from "../lib/bench-units";
import { axisTick, chartColors } from "../lib/chart-colors";
import { formatNumber } from "../lib/format";
import { niceTicks } from "../lib/nice-ticks";

/** How far each reading sits off the line, in load; an outlier flag colours its bar. */
export function ResidualChart({ fit, units, height = 180 }: { fit: Pick<BenchFit, "residualsN" | "flags">; units: BenchUnits; height?: number }) {
  const u = benchUnits[units];
  const outliers = new Set(fit.flags.filter((f) => f.code === "outlier").map((f) => f.readingIndex));
  const data = fit.residualsN.map((r, i) => ({ name: `${i + 1}`, value: loadFromN(units, r), outlier: outliers.has(i) }));
  // Symmetric about zero, so bars above and below the line read alike.
  const maxAbs = Math.max(...data.map((d) => Math.abs(d.value)), units === "imperial" ? 0.5 : 2);
  const step = niceTicks(0, maxAbs, 2)[1] ?? maxAbs;
  const top = Math.ceil((maxAbs * 1.05) / step) * step;
  const ticks = Array.from({ length: Math.round((2 * top) / step) + 1 }, (_, i) => -top + i * step);
  const digits = ticks.some((t) => !Number.isInteger(t)) ? 1 : 0;
  return (
    <div style={{ height }} role="img" aria-label="Residuals: each reading's distance from the fitted line">
      <ResponsiveContainer width="100%" height="100%">
        <BarChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
          <CartesianGrid stroke={chartColors.grid} vertical={false} />
          <XAxis dataKey="name" tick={axisTick}>
            <Label value="Reading" position="insideBottom" offset={-14} fill={chartColors.inkMuted} fontSize={12} />
          </XAxis>
          <YAxis tick={axisTick} width={56} domain={[ticks[0], ticks.at(-1)!]} ticks={ticks} tickFormatter={(v: number) => formatNumber(v, digits)}>
            <Label value={`Off the line (${u.load})`} angle={-90} position="insideLeft" offset={4} fill={chartColors.inkMuted} fontSize={12} style={{ textAnchor: "middle" }} />
          </YAxis>
          <Tooltip formatter={(v) => [`${formatNumber(Number(v), 2)} ${u.load}`, "Off the line"]} labelFormatter={(l) => `Reading ${l}`} contentStyle={{ borderRadius: 8, fontSize: 13 }} />
          <ReferenceLine y={0} stroke={chartColors.inkMuted} />
          <Bar dataKey="value" isAnimationActive={false} maxBarSize={36}>
            {data.map((d) => (
              <Cell key={d.name} fill={d.outlier ? chartColors.danger : chartColors.accent} />
            ))}
          </Bar>
        </BarChart>
      </ResponsiveContainer>
    </div>
  );
}
