import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { axisTick, shotColors } from "./colors";
import { roundTicksWithin, type ChartPoint } from "./series";

export interface TimeLine {
  key: string;
  label: string;
  color: string;
  dashed?: boolean;
  points: ChartPoint[];
}

export interface TimeEvent {
  key: string;
  label: string;
  /** ms from puck strike. */
  t: number;
  color?: string;
}

interface Props {
  lines: TimeLine[];
  events: TimeEvent[];
  /** e.g. "km/h", "°". */
  unit: string;
  /** Words for screen readers: what the chart shows. */
  ariaLabel: string;
  digits?: number;
  height?: number;
  /** A vertical line that follows the frame being shown (side by side). */
  cursorT?: number | null;
  /** A click on the chart picks that time (ms from puck strike). */
  onPickTime?: (t: number) => void;
  /** Said in the chart's place when no line has a point (an empty box tells nobody anything). */
  emptyText?: string;
}

const fmt = (v: number, d: number) => v.toFixed(d).replace("-", "−");

/** A quantity against time from puck strike, with the shot's events as dashed lines. */
export function TimeChart({ lines, events, unit, ariaLabel, digits = 1, height = 260, cursorT = null, onPickTime, emptyText = "Nothing to draw yet." }: Props) {
  const ts = lines.flatMap((l) => l.points.map((p) => p.t));
  if (!ts.length)
    return (
      <div style={{ height }} className="flex items-center justify-center rounded-lg border border-dashed border-line px-6 text-center text-sm text-ink-muted">
        <p>{emptyText}</p>
      </div>
    );
  const lo = Math.min(...ts);
  const hi = Math.max(...ts);
  return (
    <div style={{ height }} role="img" aria-label={ariaLabel} className={onPickTime ? "cursor-crosshair" : undefined}>
      <ResponsiveContainer width="100%" height="100%">
        <LineChart
          margin={{ top: 34, right: 16, bottom: 20, left: 0 }}
          onClick={(s) => {
            const t = Number((s as { activeLabel?: unknown } | null)?.activeLabel);
            if (onPickTime && Number.isFinite(t)) onPickTime(t);
          }}
        >
          <CartesianGrid stroke={shotColors.grid} />
          <XAxis
            type="number"
            dataKey="t"
            domain={[lo, hi]}
            ticks={roundTicksWithin(lo, hi)}
            tick={axisTick}
            tickFormatter={(t: number) => fmt(t, 0)}
            allowDuplicatedCategory={false}
            label={{ value: "ms from puck strike", position: "insideBottom", offset: -12, fill: shotColors.inkMuted, fontSize: 12 }}
          />
          <YAxis tick={axisTick} width={44} tickFormatter={(v: number) => fmt(v, Math.abs(v) < 10 && v % 1 ? 1 : 0)} />
          <Tooltip
            isAnimationActive={false}
            labelFormatter={(t) => `${fmt(Number(t), 2)} ms from puck strike`}
            formatter={(v, name) => [`${fmt(Number(v), digits)} ${unit}`, name]}
            contentStyle={{ borderRadius: 8, borderColor: shotColors.line, fontSize: 13 }}
          />
          {events.map((e, i) => (
            <ReferenceLine
              key={e.key}
              x={e.t}
              stroke={e.color ?? shotColors.event}
              strokeDasharray="4 3"
              ifOverflow="extendDomain"
              label={(p: { viewBox?: { x?: number; y?: number } }) => (
                <text x={(p.viewBox?.x ?? 0) + 4} y={(p.viewBox?.y ?? 0) - 8 + (i % 3) * 13} fill={e.color ?? shotColors.inkMuted} fontSize={11} fontWeight={500}>
                  {e.label}
                </text>
              )}
            />
          ))}
          {cursorT !== null && <ReferenceLine x={cursorT} stroke={shotColors.cursor} strokeWidth={1.5} ifOverflow="extendDomain" />}
          {lines.map((l) => (
            <Line
              key={l.key}
              data={l.points}
              dataKey="v"
              name={l.label}
              stroke={l.color}
              strokeWidth={2.25}
              strokeDasharray={l.dashed ? "6 4" : undefined}
              dot={false}
              isAnimationActive={false}
              connectNulls
            />
          ))}
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
}

/** The chart's legend as plain HTML (recharts' legend cannot say which line is dashed clearly). */
export function ChartLegend({ lines }: { lines: Pick<TimeLine, "key" | "label" | "color" | "dashed">[] }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-muted">
      {lines.map((l) => (
        <li key={l.key} className="flex items-center gap-1.5">
          <svg aria-hidden width="22" height="8">
            <line x1="1" y1="4" x2="21" y2="4" stroke={l.color} strokeWidth="2.5" strokeDasharray={l.dashed ? "5 3" : undefined} />
          </svg>
          {l.label}
        </li>
      ))}
    </ul>
  );
}
