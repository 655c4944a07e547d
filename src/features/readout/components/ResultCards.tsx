import { METRICS, eventTimingText, formatValue, metricText, noteMetric, type MetricKey, type ShotReadout } from "@shared/schemas/readout";
import type { ShotResults } from "@shared/schemas/shot-results";
import type { UnitSystem } from "@shared/units";
import type { ShotStickInfo } from "@shared/schemas/shots";
import { formatDate } from "@/lib/format";

/** Which stiffness the stored energy used: the bench test in force on the shot's date, else the rating. */
export function stiffnessWords(stick: ShotStickInfo): string {
  const flex = stick.flex?.toFixed(0) ?? "—";
  return stick.flexSource === "measured" && stick.testedOn
    ? `measured flex ${flex}, bench test of ${formatDate(stick.testedOn)} (the one in force on the shot's date)`
    : `rated flex ${flex} (no bench test by the shot's date)`;
}

// One card per result: the number large, its ± beside it, one line on what it is, and any
// plausibility note the engine attached to it.

const whyMissing: Record<MetricKey, string> = {
  puckExitSpeed: "Mark the puck on at least 3 frames after release.",
  bladeSpeedAtStrike: "Mark the blade heel and toe on the frames around puck strike.",
  peakBend: "Mark the top hand, bottom hand and blade heel through the loading.",
  loadTime: "Set the ice strike event on the Digitise page.",
  contactTime: "Set the puck strike and release events.",
  storedEnergy: "Needs the shaft's bend and the stick's flex: pick the stick on the shot, or bench-test it in Stick lab.",
};

export function ResultCards({ results, units, stick }: { results: ShotResults; units: UnitSystem; stick: ShotReadout["stick"] }) {
  return (
    <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" aria-label="Results">
      {METRICS.map((m) => {
        const t = metricText(m, results, units);
        const notes = results.notes.filter((n) => noteMetric(n.code) === m.key);
        return (
          <li key={m.key} className="flex flex-col rounded-[var(--radius-card)] border border-line bg-surface p-5 shadow-[var(--shadow-card)]" data-testid={`result-${m.key}`}>
            <p className="text-sm font-medium text-ink-muted">{m.label}</p>
            {t ? (
              <p className="mt-1 flex flex-wrap items-baseline gap-x-2">
                <span className="text-4xl font-semibold tracking-tight text-ink tabular-nums" data-role="value">
                  {t.value}
                </span>
                {t.u !== null && (
                  <span className="text-base text-ink-muted tabular-nums" data-role="uncertainty">
                    ± {t.u}
                  </span>
                )}
                <span className="text-base font-medium text-ink-muted" data-role="unit">
                  {t.unit}
                </span>
              </p>
            ) : (
              <p className="mt-2 text-sm text-ink-muted" data-role="missing">
                {whyMissing[m.key]}
              </p>
            )}
            <p className="mt-2 text-sm text-ink-faint">
              {m.hint}
              {(m.key === "loadTime" || m.key === "contactTime") && t ? ` Times ${eventTimingText(results)}.` : ""}
            </p>
            {m.key === "peakBend" && results.shaftDeflection && (
              <p className="mt-1 text-sm text-ink-muted">Shaft deflection {formatValue("length", results.shaftDeflection.valueMm, units)}</p>
            )}
            {m.key === "storedEnergy" && t && stick?.flex && (
              <p className="mt-1 text-sm text-ink-muted">
                From {stick.label}&rsquo;s {stiffnessWords(stick)}.
              </p>
            )}
            {notes.map((n) => (
              <p key={n.code} className="mt-3 rounded-md bg-warn-soft px-3 py-2 text-sm text-warn" role="note">
                {n.message}
              </p>
            ))}
          </li>
        );
      })}
    </ul>
  );
}
