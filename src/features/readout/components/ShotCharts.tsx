import { useState } from "react";
import { Link } from "react-router-dom";
import { Card } from "@/components/ui";
import { ChartLegend, TimeChart, type TimeEvent, type TimeLine } from "@/components/shot/TimeChart";
import { shotColors } from "@/components/shot/colors";
import { digitiseUrl } from "@/components/shot/frames";
import { chartPoints } from "@/components/shot/series";
import { frameClock } from "@shared/frame-clock";
import { convert, unitOf, type ShotReadout } from "@shared/schemas/readout";
import { eventLabels } from "@shared/schemas/shots";
import type { ShotResults } from "@shared/schemas/shot-results";
import type { UnitSystem } from "@shared/units";

export function eventMarks(r: ShotReadout): TimeEvent[] {
  return r.events.filter((e) => e.tFromStrikeMs !== null).map((e) => ({ key: e.key, label: eventLabels[e.key], t: e.tFromStrikeMs! }));
}

/** The frame at a chart time (ms from puck strike, else from the shot's first frame), on the clip's own frame clock. */
export function frameAtChartTime(r: Pick<ShotReadout, "events" | "shot" | "clip" | "frameTimes">, tMs: number): number {
  const clock = frameClock(r.frameTimes, r.clip.captureFps);
  const strike = r.events.find((e) => e.key === "puckStrike")?.frame ?? r.shot.frameStart;
  return clock.frameAt(clock.t(strike) + tMs / 1000, r.shot.frameStart, r.shot.frameEnd);
}

export const NO_BEND_MARKS = "No bend marks on this shot. The bend is drawn once the top hand, bottom hand and heel are marked through the load.";

/** Puck and blade speed, and bend angle, against time; a click opens that frame on the Digitise page. */
export function ShotCharts({ readout: r, results, units }: { readout: ShotReadout; results: ShotResults; units: UnitSystem }) {
  const [picked, setPicked] = useState<number | null>(null);
  const speed = (v: number) => convert("speed", v, units);
  const speedLines: TimeLine[] = [
    { key: "puck", label: "Puck speed", color: shotColors.puck, points: chartPoints(results.series.puckSpeed, speed) },
    { key: "blade", label: "Blade speed", color: shotColors.blade, points: chartPoints(results.series.bladeSpeed, speed) },
  ];
  const bendLines: TimeLine[] = [{ key: "bend", label: "Bend angle", color: shotColors.bend, points: chartPoints(results.series.bendAngle, (v) => v) }];
  const events = eventMarks(r);
  const pickedFrame = picked === null ? null : frameAtChartTime(r, picked);
  const speedUnit = unitOf("speed", units);
  const pickLine = (
    <p className="mt-2 min-h-6 text-sm text-ink-muted" aria-live="polite">
      {pickedFrame === null ? (
        "Click a chart to find the frame at that moment."
      ) : (
        <>
          Frame {pickedFrame} ({picked!.toFixed(1)} ms from puck strike) —{" "}
          <Link className="font-medium text-accent underline-offset-2 hover:underline" to={digitiseUrl(r.clip.id, r.shot.id, pickedFrame)}>
            open it on the Digitise page
          </Link>
        </>
      )}
    </p>
  );
  return (
    <div className="grid gap-6 xl:grid-cols-2">
      <Card title={`Puck and blade speed (${speedUnit})`} description="Smoothed from the marks; dashed lines are the events." actions={<ChartLegend lines={speedLines} />}>
        <TimeChart lines={speedLines} events={events} unit={speedUnit} ariaLabel={`Puck and blade speed in ${speedUnit} against time from puck strike`} onPickTime={setPicked} cursorT={picked} />
        {pickLine}
      </Card>
      <Card title="Bend angle (°)" description="0° when the shaft is straight; peak bend is the highest point.">
        <TimeChart lines={bendLines} events={events} unit="°" ariaLabel="Shaft bend angle in degrees against time from puck strike" onPickTime={setPicked} cursorT={picked}
          emptyText={NO_BEND_MARKS} />
        {bendLines[0]!.points.length > 0 && pickLine}
      </Card>
    </div>
  );
}
