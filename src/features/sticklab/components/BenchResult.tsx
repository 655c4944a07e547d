import type { ReactNode } from "react";
import type { BenchFit, BenchReading } from "@shared/mechanics/sticklab";
import { Alert } from "@/components/ui";
import { cn } from "@/lib/cn";
import { type BenchUnits } from "../lib/bench-units";
import { formatFlex, formatNumber, formatPercent, formatRated } from "../lib/format";
import { FitChart } from "./FitChart";
import { FlexGauge } from "./FlexGauge";
import { ResidualChart } from "./ResidualChart";

interface Props {
  fit: BenchFit;
  readings: readonly BenchReading[];
  units: BenchUnits;
  alertPercent: number;
  /** The live preview leaves the residual chart out to stay compact. */
  compact?: boolean;
}

function Stat({ label, children, hint }: { label: string; children: ReactNode; hint?: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-xs font-medium tracking-wide text-ink-muted uppercase">{label}</dt>
      <dd className="mt-0.5 text-[0.95rem] font-medium text-ink tabular-nums">{children}</dd>
      {hint && <dd className="text-xs text-ink-muted">{hint}</dd>}
    </div>
  );
}

/** What a bench fit says, the way a coach reads it: the flex, how it compares, whether to trust it, and the picture. */
export function BenchResult({ fit, readings, units, alertPercent, compact = false }: Props) {
  const below = fit.percentOfRated !== null && fit.percentOfRated < alertPercent;
  const spanNote =
    Math.abs(fit.spanMm - fit.referenceSpanMm) < 0.5 && Math.abs(fit.loadPointMm - fit.spanMm / 2) < 0.5
      ? `Centre load on a ${formatNumber(fit.spanMm, 0)} mm span: the rating's own test.`
      : `Tested on a ${formatNumber(fit.spanMm, 0)} mm span with the load ${formatNumber(fit.loadPointMm, 0)} mm from a support; converted to the rating's ${formatNumber(fit.referenceSpanMm, 0)} mm centre-load test.`;
  const intercept = units === "imperial" ? `${formatNumber(fit.interceptLbf, 1)} lbf` : `${formatNumber(fit.interceptN, 1)} N`;
  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-end gap-x-8 gap-y-3">
        <div>
          <p className="text-sm text-ink-muted">Measures</p>
          <p className="text-4xl font-semibold tracking-tight text-ink tabular-nums" data-testid="measured-flex">
            {formatFlex(fit.measuredFlex)} <span className="text-xl font-medium text-ink-muted">flex</span>
          </p>
        </div>
        {fit.ratedFlex !== null && (
          <div className="min-w-48 flex-1">
            <p className={cn("text-lg font-semibold tabular-nums", below ? "text-warn" : "text-ok")} data-testid="percent-of-rated">
              {formatPercent(fit.percentOfRated)} of rated {formatRated(fit.ratedFlex)}
            </p>
            <FlexGauge percent={fit.percentOfRated} alertPercent={alertPercent} className="mt-2" />
            <p className="mt-1.5 text-xs text-ink-muted">
              Bar: measured against the rating (grey mark); the amber mark is the team's alert level, {alertPercent} %.
            </p>
          </div>
        )}
      </div>
      <p className="-mt-2 text-sm text-ink-muted">{spanNote}</p>

      <dl className="grid grid-cols-2 gap-x-6 gap-y-3 sm:grid-cols-4">
        <Stat label="Stiffness on this span" hint={`${formatNumber(fit.stiffnessNPerMm, 2)} N/mm`}>
          {formatNumber(fit.stiffnessLbfPerIn, 1)} lbf/in
        </Stat>
        <Stat label="R²" hint="1 = readings exactly on a line">
          {formatNumber(fit.r2, 4)}
        </Stat>
        <Stat label="Line at zero deflection" hint="ideally close to 0">
          {intercept}
        </Stat>
        <Stat label="EI" hint={`${fit.n} readings`}>
          {formatNumber(fit.eiNm2, 0)} N·m²
        </Stat>
      </dl>

      {fit.flags.length === 0 ? (
        <Alert tone="ok">The readings lie on a straight line: nothing to re-check.</Alert>
      ) : (
        <Alert tone="warn" title="Check before trusting this flex">
          <ul className="list-disc pl-5">
            {fit.flags.map((f) => (
              <li key={`${f.code}-${f.readingIndex ?? ""}`}>{f.message.replace(/^./, (c) => c.toUpperCase())}.</li>
            ))}
          </ul>
        </Alert>
      )}

      <div className={cn("grid gap-4", !compact && "lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]")}>
        <figure>
          <figcaption className="mb-1 text-sm font-medium text-ink">Readings and the fitted line</figcaption>
          <FitChart readings={readings} fit={fit} units={units} height={compact ? 240 : 300} />
        </figure>
        {!compact && (
          <figure>
            <figcaption className="mb-1 text-sm font-medium text-ink">Residuals</figcaption>
            <ResidualChart fit={fit} units={units} height={300} />
          </figure>
        )}
      </div>
    </div>
  );
}
