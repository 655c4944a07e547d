import { G, Line, Path, Rect, Svg, Text } from "@react-pdf/renderer";
import type { SeriesPoint } from "../../../shared/schemas/shot-results";
import { linePath, linear, placeEventLabels, thin, tickLabel, type Box } from "./chart-geometry";
import { FONT } from "./fonts";

// A line chart as SVG for the report: time from puck strike on x, the events as dashed lines.

export interface ChartLine {
  label: string;
  color: string;
  points: SeriesPoint[];
  /** SI → shown value. */
  convert: (v: number) => number;
}

export interface ChartEvent {
  label: string;
  tMs: number;
}

interface Props {
  width: number;
  height: number;
  yLabel: string;
  lines: ChartLine[];
  events: ChartEvent[];
  /** Said in the chart's place when no line has a point. */
  emptyText?: string;
}

const INK = "#1b2224";
const MUTED = "#556064";
const GRID = "#e3e6e0";

export function ReportChart({ width, height, yLabel, lines, events, emptyText }: Props) {
  const box: Box = { width, height, left: 34, right: 8, top: 14, bottom: 24 };
  const pts = lines.flatMap((l) => l.points.map((p) => ({ x: p.tFromStrikeMs, y: l.convert(p.value) })));
  if (!pts.length)
    return emptyText ? (
      <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
        <Rect x={box.left} y={box.top} width={width - box.left - box.right} height={height - box.top - box.bottom} fill="#fafbf9" stroke={GRID} strokeWidth={0.5} />
        <Text x={(box.left + width - box.right) / 2} y={height / 2} style={{ fontFamily: FONT, fontSize: 7 }} fill={MUTED} textAnchor="middle">
          {emptyText}
        </Text>
      </Svg>
    ) : null;
  const xs = pts.map((p) => p.x);
  const ys = pts.map((p) => p.y);
  const x = linear([Math.min(...xs), Math.max(...xs)], [box.left, width - box.right], 6);
  const y = linear([Math.min(0, ...ys), Math.max(...ys)], [height - box.bottom, box.top], 4);
  const font = { fontFamily: FONT, fontSize: 6.5 };
  const eventFont = 5.5;
  const labels = placeEventLabels(events.map((e) => ({ x: x(e.tMs), text: e.label })), { fontSize: eventFont, right: width - box.right });
  return (
    <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
      <Rect x={box.left} y={box.top} width={width - box.left - box.right} height={height - box.top - box.bottom} fill="#fafbf9" />
      {y.ticks.map((t) => (
        <G key={`y${t}`}>
          <Line x1={box.left} x2={width - box.right} y1={y(t)} y2={y(t)} stroke={GRID} strokeWidth={0.5} />
          <Text x={box.left - 3} y={y(t) + 2} style={font} fill={MUTED} textAnchor="end">
            {tickLabel(t, y.ticks)}
          </Text>
        </G>
      ))}
      {x.ticks.map((t) => (
        <Text key={`x${t}`} x={x(t)} y={height - box.bottom + 9} style={font} fill={MUTED} textAnchor="middle">
          {tickLabel(t, x.ticks)}
        </Text>
      ))}
      <Text x={(box.left + width - box.right) / 2} y={height - 3} style={font} fill={MUTED} textAnchor="middle">
        time from puck strike (ms)
      </Text>
      <Text x={box.left} y={8} style={font} fill={MUTED}>
        {yLabel}
      </Text>
      {events.map((e, i) => (
        <G key={e.label}>
          <Line x1={x(e.tMs)} x2={x(e.tMs)} y1={box.top} y2={height - box.bottom} stroke={MUTED} strokeWidth={0.6} strokeDasharray="2 2" />
          <Text x={labels[i].x0} y={box.top + 6 + labels[i].row * 7} style={{ ...font, fontSize: eventFont }} fill={INK}>
            {e.label}
          </Text>
        </G>
      ))}
      {lines.map((l) => (
        <Path
          key={l.label}
          d={linePath(thin(l.points, 300).map((p) => ({ x: x(p.tFromStrikeMs), y: y(l.convert(p.value)) })))}
          stroke={l.color}
          strokeWidth={1.2}
          fill="none"
        />
      ))}
      {lines.length > 1 &&
        lines.map((l, i) => (
          <G key={`k${l.label}`}>
            <Line x1={width - box.right - 96 + i * 48} x2={width - box.right - 86 + i * 48} y1={5.5} y2={5.5} stroke={l.color} strokeWidth={1.5} />
            <Text x={width - box.right - 83 + i * 48} y={8} style={font} fill={INK}>
              {l.label}
            </Text>
          </G>
        ))}
    </Svg>
  );
}
