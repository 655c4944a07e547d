import { CartesianGrid, ComposedChart, Label, Legend, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import type { BenchFit, BenchReading } from "@shared/mechanics/sticklab";
import { deflectionFromMm, loadFromN, benchUnits, type BenchUnits } from "../lib/bench-units";
import { axisTick, chartColors } from "../lib/chart-colors";
import { formatNumber } from "../lib/format";

interface Props {
  readings: readonly BenchReading[];
  fit: Pick<BenchFit, "stiffnessNPerMm" | "interceptN">;
  units: BenchUnits;
  height?: number;
}

/** Load against deflection: the readings as dots and the fitted line through them. */
export function FitChart({ readings, fit, units, height = 300 }: Props) {
  const u = benchUnits[units];
  const points = readings.map((r) => ({ x: deflectionFromMm(units, r.deflectionMm), y: loadFromN(units, r.loadN) }));
  const maxMm = Math.max(...readings.map((r) => r.deflectionMm)) * 1.08;
  const line = [0, maxMm].map((mm) => ({ x: deflectionFromMm(units, mm), y: loadFromN(units, fit.stiffnessNPerMm * mm + fit.interceptN) }));
  const digits = units === "imperial" ? 2 : 0;
  return (
    <div style={{ height }} role="img" aria-label={`Load against deflection: ${readings.length} readings and the fitted line`}>
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
          <CartesianGrid stroke={chartColors.grid} />
          <XAxis type="number" dataKey="x" domain={[0, "auto"]} allowDataOverflow tick={axisTick} tickFormatter={(v: number) => formatNumber(v, digits)}>
            <Label value={`Deflection under the load (${u.deflection})`} position="insideBottom" offset={-14} fill={chartColors.inkMuted} fontSize={12} />
          </XAxis>
          <YAxis type="number" dataKey="y" domain={[0, "auto"]} allowDataOverflow tick={axisTick} width={56}>
            <Label value={`Load (${u.load})`} angle={-90} position="insideLeft" offset={4} fill={chartColors.inkMuted} fontSize={12} style={{ textAnchor: "middle" }} />
          </YAxis>
          <Tooltip
            formatter={(v) => formatNumber(Number(v), digits)}
            labelFormatter={() => ""}
            contentStyle={{ borderRadius: 8, borderColor: chartColors.line, fontSize: 13 }}
          />
          <Legend verticalAlign="top" height={28} iconSize={10} wrapperStyle={{ fontSize: 13 }} />
          <Line data={line} dataKey="y" name="Fitted line" stroke={chartColors.accent} strokeWidth={2} dot={false} isAnimationActive={false} legendType="line" />
          <Scatter data={points} dataKey="y" name="Readings" fill={chartColors.ink} isAnimationActive={false} legendType="circle" />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}
