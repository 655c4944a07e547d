import { Card } from "@/components/ui";
import { ChartLegend, TimeChart, type TimeEvent, type TimeLine } from "@/components/shot/TimeChart";
import { chartPoints } from "@/components/shot/series";
import { convert, unitOf, type ShotReadout } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";
import type { Side } from "../lib/differences";

interface Props {
  shots: Record<Side, ShotReadout>;
  names: Record<Side, string>;
  colors: Record<Side, string>;
  units: UnitSystem;
  cursorT: number;
  onPickTime: (t: number) => void;
}

/** Both shots on one time axis from puck strike: A and B keep their colours; blades are dashed. */
export function OverlaidCharts({ shots, names, colors, units, cursorT, onPickTime }: Props) {
  const sides = (["a", "b"] as const).filter((s) => shots[s].results);
  const speed = (v: number) => convert("speed", v, units);
  const speedLines: TimeLine[] = sides.flatMap((s) => [
    { key: `puck-${s}`, label: `Puck ${names[s].replace("Shot ", "")}`, color: colors[s], points: chartPoints(shots[s].results!.series.puckSpeed, speed, 400) },
    { key: `blade-${s}`, label: `Blade ${names[s].replace("Shot ", "")}`, color: colors[s], dashed: true, points: chartPoints(shots[s].results!.series.bladeSpeed, speed, 400) },
  ]);
  const bendLines: TimeLine[] = sides
    .map((s) => ({ key: `bend-${s}`, label: `Bend ${names[s].replace("Shot ", "")}`, color: colors[s], points: chartPoints(shots[s].results!.series.bendAngle, (v) => v, 400) }))
    .filter((l) => l.points.length > 0);
  const noBend = sides.filter((s) => !shots[s].results!.series.bendAngle.frame.length).map((s) => names[s]);
  const events: TimeEvent[] = [
    { key: "strike", label: "Puck strike", t: 0 },
    ...sides.flatMap((s) =>
      shots[s].events
        .filter((e) => e.tFromStrikeMs !== null && (e.key === "release" || e.key === "iceStrike"))
        .map((e) => ({ key: `${s}-${e.key}`, label: `${e.key === "release" ? "release" : "ice"} ${names[s].replace("Shot ", "")}`, t: e.tFromStrikeMs!, color: colors[s] })),
    ),
  ];
  if (!sides.length) return null;
  const u = unitOf("speed", units);
  return (
    <div className="grid gap-6 xl:grid-cols-2">
      <Card title={`Puck and blade speed (${u})`} description="Click to step both clips to that moment." actions={<ChartLegend lines={speedLines} />}>
        <TimeChart lines={speedLines} events={events} unit={u} ariaLabel={`Puck and blade speed of both shots in ${u}`} cursorT={cursorT} onPickTime={onPickTime} />
      </Card>
      <Card title="Bend angle (°)" description={noBend.length === 1 && bendLines.length ? `${noBend[0]} has no bend marks.` : undefined} actions={<ChartLegend lines={bendLines} />}>
        <TimeChart lines={bendLines} events={events} unit="°" ariaLabel="Shaft bend angle of both shots in degrees" cursorT={cursorT} onPickTime={onPickTime}
          emptyText="Neither shot has bend marks (top hand, bottom hand and heel through the load)." />
      </Card>
    </div>
  );
}
