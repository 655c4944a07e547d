import { useLayoutEffect, useRef, useState, type PointerEvent, type ReactNode } from "react";
import { beamAt, type BeamInput, type BeamResult, type BeamStation } from "@shared/mechanics/sticklab";
import { toDisplay, type Quantity, type UnitSystem } from "@shared/units";
import { formatQuantity } from "@/lib/units";
import { chartColors } from "../lib/chart-colors";
import { formatNumber } from "../lib/format";
import { niceTicks } from "../lib/nice-ticks";

// The stick, its shear and moment diagrams and its deflected shape, stacked on one x axis drawn
// to scale along the shaft. Own SVG rather than a chart library: the diagrams must share one
// exact x scale with the drawing of the stick, supports and loads above them.

interface Props {
  input: BeamInput;
  result: BeamResult;
  system: UnitSystem;
  /** What x is measured from, e.g. "from the butt end". */
  axisFrom: string;
  supportNames: [string, string];
  loadNames: string[];
}

const LEFT = 64;
const RIGHT = 44;
const GAP = 18;
const H = { stick: 140, shear: 150, moment: 170, deflection: 140, axis: 44 };

const fmt = (q: Quantity, si: number, system: UnitSystem, digits?: number) => formatQuantity(q, si, system, { digits });

interface PanelProps {
  top: number;
  height: number;
  title: string;
  stations: readonly BeamStation[];
  value: (s: BeamStation) => number;
  /** SI → shown units. */
  show: (si: number) => number;
  color: string;
  /** Deflection: positive (the loads' direction) drawn downward. */
  downward?: boolean;
  xOf: (mm: number) => number;
  /** Drawing width in px (the SVG is drawn at its real size, so text stays legible). */
  width: number;
  /** Right of the title, e.g. the largest value. */
  note?: ReactNode;
  children?: (yOf: (si: number) => number) => ReactNode;
}

function Panel({ top, height, title, stations, value, show, color, downward = false, xOf, width, note, children }: PanelProps) {
  const shown = stations.map((s) => show(value(s)));
  const lo = Math.min(0, ...shown);
  const hi = Math.max(0, ...shown);
  const padLo = lo - (hi - lo || 1) * 0.08;
  const padHi = hi + (hi - lo || 1) * 0.12;
  const innerTop = top + 24;
  const innerH = height - 30;
  const yShown = (v: number) => (downward ? innerTop + ((v - padLo) / (padHi - padLo)) * innerH : innerTop + innerH - ((v - padLo) / (padHi - padLo)) * innerH);
  const yOf = (si: number) => yShown(show(si));
  const pts = stations.map((s) => `${xOf(s.xMm).toFixed(2)},${yOf(value(s)).toFixed(2)}`);
  const zero = yShown(0);
  const first = stations[0];
  const last = stations.at(-1)!;
  const area = `M${xOf(first.xMm)},${zero} L${pts.join(" L")} L${xOf(last.xMm)},${zero} Z`;
  return (
    <g>
      <text x={LEFT} y={top + 12} fontSize={14} fontWeight={600} fill={chartColors.ink}>
        {title}
      </text>
      {note && (
        <text x={width - RIGHT} y={top + 12} fontSize={13} fontWeight={600} textAnchor="end" fill={chartColors.danger}>
          {note}
        </text>
      )}
      {niceTicks(padLo, padHi, 5).map((t) => (
        <g key={t}>
          <line x1={LEFT} x2={width - RIGHT} y1={yShown(t)} y2={yShown(t)} stroke={t === 0 ? chartColors.inkFaint : chartColors.grid} />
          <text x={LEFT - 8} y={yShown(t) + 4} fontSize={12} textAnchor="end" fill={chartColors.inkMuted}>
            {formatNumber(t, Math.abs(padHi - padLo) < 5 ? 1 : 0)}
          </text>
        </g>
      ))}
      <path d={area} fill={color} fillOpacity={0.12} />
      <polyline points={pts.join(" ")} fill="none" stroke={color} strokeWidth={2.25} strokeLinejoin="round" />
      {children?.(yOf)}
    </g>
  );
}

function Support({ x, y, name, reaction, width }: { x: number; y: number; name: string; reaction: string; width: number }) {
  const tx = Math.min(Math.max(x, 40), width - 44);
  return (
    <g>
      <path d={`M${x},${y} l-11,18 h22 Z`} fill={chartColors.accentSoft} stroke={chartColors.accent} strokeWidth={1.5} />
      <text x={tx} y={y + 34} fontSize={12} textAnchor="middle" fill={chartColors.ink} fontWeight={600}>
        {name}
      </text>
      <text x={tx} y={y + 49} fontSize={12} textAnchor="middle" fill={chartColors.inkMuted}>
        holds {reaction}
      </text>
    </g>
  );
}

function LoadArrow({ x, y, name, force }: { x: number; y: number; name: string; force: string }) {
  return (
    <g>
      <line x1={x} x2={x} y1={y - 40} y2={y - 9} stroke={chartColors.danger} strokeWidth={2.5} />
      <path d={`M${x},${y - 2} l-6,-10 h12 Z`} fill={chartColors.danger} />
      <text x={x} y={y - 56} fontSize={12} textAnchor="middle" fill={chartColors.ink} fontWeight={600}>
        {name}
      </text>
      <text x={x} y={y - 43} fontSize={12} textAnchor="middle" fill={chartColors.danger}>
        {force}
      </text>
    </g>
  );
}

export function BeamDiagrams({ input, result, system, axisFrom, supportNames, loadNames }: Props) {
  const [hoverMm, setHoverMm] = useState<number | null>(null);
  const box = useRef<HTMLDivElement>(null);
  const [W, setW] = useState(900);
  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    setW(Math.max(480, Math.round(el.getBoundingClientRect().width)));
    const ro = new ResizeObserver(([e]) => setW(Math.max(480, Math.round(e.contentRect.width))));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  const PLOT_W = W - LEFT - RIGHT;
  const xOf = (mm: number) => LEFT + (mm / input.lengthMm) * PLOT_W;
  const posDigits = system === "imperial" ? 1 : 0;
  const len = (mm: number, digits?: number) => fmt("length", mm, system, digits);
  const lengthUnit = toDisplay("length", 0, system).unit;
  const forceUnit = toDisplay("force", 0, system).unit;
  const momentUnit = toDisplay("moment", 0, system).unit;
  const hasDeflection = result.stations.every((s) => s.deflectionMm !== undefined);

  const tops = { stick: 0, shear: H.stick + GAP, moment: H.stick + GAP + H.shear + GAP, deflection: 0, axis: 0 };
  tops.deflection = tops.moment + H.moment + GAP;
  tops.axis = (hasDeflection ? tops.deflection + H.deflection : tops.moment + H.moment) + 6;
  const height = tops.axis + H.axis;
  const breakX = xOf(result.maxMoment.xMm);
  const shaftY = 98;
  const ticks = niceTicks(0, toDisplay("length", input.lengthMm, system).value, 8);
  const hover = hoverMm === null ? null : beamAt(input, hoverMm);

  const onMove = (e: PointerEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const x = ((e.clientX - r.left) / r.width) * W;
    const mm = ((x - LEFT) / PLOT_W) * input.lengthMm;
    setHoverMm(mm >= 0 && mm <= input.lengthMm ? mm : null);
  };

  return (
    <div ref={box} className="w-full">
    <svg
      viewBox={`0 0 ${W} ${height}`}
      width={W}
      height={height}
      className="block max-w-full touch-none select-none"
      role="img"
      aria-label={`Beam model: largest bending moment ${fmt("moment", Math.abs(result.maxMoment.valueNm), system)} at ${len(result.maxMoment.xMm, posDigits)} ${axisFrom}`}
      onPointerMove={onMove}
      onPointerLeave={() => setHoverMm(null)}
      fontFamily="inherit"
    >
      {/* the stick, supports and loads */}
      <rect x={xOf(0)} y={shaftY - 4} width={xOf(input.lengthMm) - xOf(0)} height={8} rx={4} fill={chartColors.ink} />
      <Support x={xOf(input.supportsMm[0])} y={shaftY + 5} name={supportNames[0]} reaction={fmt("force", result.reactionsN[0], system)} width={W} />
      <Support x={xOf(input.supportsMm[1])} y={shaftY + 5} name={supportNames[1]} reaction={fmt("force", result.reactionsN[1], system)} width={W} />
      {input.loads.map((l, i) => (
        <LoadArrow key={i} x={xOf(l.xMm)} y={shaftY - 4} name={loadNames[i] ?? `Load ${i + 1}`} force={fmt("force", l.forceN, system)} />
      ))}

      <Panel top={tops.shear} height={H.shear} title={`Shear force (${forceUnit})`} stations={result.stations} value={(s) => s.shearN} show={(v) => toDisplay("force", v, system).value} color={chartColors.shear} xOf={xOf} width={W} />
      <Panel top={tops.moment} height={H.moment} title={`Bending moment (${momentUnit})`} stations={result.stations} value={(s) => s.momentNm} show={(v) => toDisplay("moment", v, system).value} color={chartColors.moment} xOf={xOf} width={W}
        note={`● Largest ${fmt("moment", Math.abs(result.maxMoment.valueNm), system)} at ${len(result.maxMoment.xMm, posDigits)}: predicted break point`}
      >
        {(yOf) => {
          const y = yOf(result.maxMoment.valueNm);
          return <circle data-testid="break-point" cx={breakX} cy={y} r={6} fill={chartColors.danger} stroke="#fff" strokeWidth={2} />;
        }}
      </Panel>
      {hasDeflection && (
        <Panel top={tops.deflection} height={H.deflection} title={`Deflected shape (${lengthUnit}, in the direction of the loads)`} stations={result.stations} value={(s) => s.deflectionMm!} show={(v) => toDisplay("length", v, system).value} color={chartColors.accent} downward xOf={xOf} width={W} />
      )}

      {/* the break point through every panel */}
      <line x1={breakX} x2={breakX} y1={shaftY - 14} y2={tops.axis} stroke={chartColors.danger} strokeDasharray="5 4" strokeWidth={1.25} />
      <text x={breakX} y={shaftY + 24} fontSize={11} textAnchor="middle" fill={chartColors.danger}>
        ✕
      </text>

      {/* x axis, to scale along the shaft */}
      <line x1={LEFT} x2={W - RIGHT} y1={tops.axis} y2={tops.axis} stroke={chartColors.inkMuted} />
      {ticks.map((t) => {
        const x = LEFT + (t / toDisplay("length", input.lengthMm, system).value) * PLOT_W;
        return (
          <g key={t}>
            <line x1={x} x2={x} y1={tops.axis} y2={tops.axis + 5} stroke={chartColors.inkMuted} />
            <text x={x} y={tops.axis + 18} fontSize={12} textAnchor="middle" fill={chartColors.inkMuted}>
              {formatNumber(t, 0)}
            </text>
          </g>
        );
      })}
      <text x={LEFT + PLOT_W / 2} y={tops.axis + 38} fontSize={13} textAnchor="middle" fill={chartColors.ink}>
        Distance along the shaft {axisFrom} ({lengthUnit})
      </text>

      {hover && (
        <g pointerEvents="none">
          <line x1={xOf(hover.xMm)} x2={xOf(hover.xMm)} y1={tops.shear} y2={tops.axis} stroke={chartColors.ink} strokeOpacity={0.35} />
          <text x={LEFT} y={14} fontSize={12} fill={chartColors.ink}>
            at {len(hover.xMm, posDigits)}: shear {fmt("force", hover.shearRightN, system)} · moment {fmt("moment", hover.momentNm, system)}
            {hover.deflectionMm !== undefined ? ` · deflection ${len(hover.deflectionMm)}` : ""}
          </text>
        </g>
      )}
    </svg>
    </div>
  );
}
