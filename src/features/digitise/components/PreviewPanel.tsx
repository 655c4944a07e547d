import type { StoredResult } from "@shared/schemas/shots";
import { formatWithU, metricDef, metricText, type MetricKey } from "@shared/schemas/readout";
import type { ShotResults } from "@shared/schemas/shot-results";
import { useUnits } from "@/lib/units";
import type { Preview } from "../preview/usePreview";
import { Panel } from "./Panel";

const nf = (v: number, d: number) => v.toLocaleString(undefined, { minimumFractionDigits: d, maximumFractionDigits: d });

/** The engine's numbers for the working copy, as it is now; and whether the server has them stored. */
export function PreviewPanel({ preview, stored, version }: { preview: Preview; stored: StoredResult | null; version: number }) {
  const units = useUnits();
  return (
    <Panel
      title="Live results"
      aside={preview.state === "ok" ? <span className="text-xs text-ink-faint">{preview.pixelsOnly ? "in pixels" : "preview"}</span> : null}
    >
      {preview.state === "idle" || preview.state === "computing" ? (
        <p className="text-sm text-ink-muted">Computing…</p>
      ) : preview.state === "missing" ? (
        <p className="text-sm text-ink-muted" data-testid="preview-missing">
          {preview.message}
        </p>
      ) : preview.state === "error" ? (
        <p className="text-sm text-danger" data-testid="preview-error">
          {preview.message}
        </p>
      ) : (
        <Numbers r={preview.results} px={preview.pixelsOnly} units={units} />
      )}
      <StoredLine stored={stored} version={version} />
    </Panel>
  );
}

function Numbers({ r, px, units }: { r: ShotResults; px: boolean; units: ReturnType<typeof useUnits> }) {
  // Calibrated: the readout's own wording (metricText), so a number and its ± read the same here,
  // on the readout, in the PDF and in the CSV. Without a calibration the engine ran at 1 mm per px:
  // "m/s" then means px per ms.
  const metric = (key: MetricKey) => metricText(metricDef(key), r, units.system)?.full ?? "—";
  const pxSpeed = (v: number | undefined, u: number | null | undefined) => (v === undefined ? "—" : `${nf(v * 1000, 0)}${u ? ` ± ${nf(u * 1000, 0)}` : ""} px/s`);
  const length = (v: number | undefined, u: number | null | undefined) =>
    v === undefined ? "—" : px ? `${nf(v, 1)}${u ? ` ± ${nf(u, 1)}` : ""} px` : formatWithU("length", v, u, units.system);
  const rows: [string, string, string?][] = [
    ["Puck exit speed", px ? pxSpeed(r.puckExitSpeed.valueMps, r.puckExitSpeed.uncertaintyMps) : metric("puckExitSpeed"), `${r.puckExitSpeed.marksUsed} marks from frame ${r.puckExitSpeed.fromFrame}`],
    [
      "Blade speed at strike",
      r.bladeSpeedAtStrike ? (px ? pxSpeed(r.bladeSpeedAtStrike.valueMps, r.bladeSpeedAtStrike.uncertaintyMps) : metric("bladeSpeedAtStrike")) : "—",
      r.bladeSpeedAtStrike ? `frame ${r.bladeSpeedAtStrike.frame}` : undefined,
    ],
    ["Peak bend", metric("peakBend"), r.peakBend ? `frame ${r.peakBend.frame}` : undefined],
    ["Shaft deflection", r.shaftDeflection ? length(r.shaftDeflection.valueMm, r.shaftDeflection.uncertaintyMm) : "—"],
    ["Load time", metric("loadTime")],
    ["Contact time", metric("contactTime"), `events ±${r.uncertainty.eventErrorFrames ?? 1} frame`],
    ["Stored energy", r.storedEnergy && !px ? metric("storedEnergy") : "—", r.storedEnergy ? undefined : "needs a stick with a flex"],
  ];
  return (
    <>
      <dl className="grid grid-cols-[1fr_auto] gap-x-3 gap-y-1.5 text-sm" data-testid="preview-numbers">
        {rows.map(([k, v, note]) => (
          <div key={k} className="contents">
            <dt className="text-ink-muted">
              {k}
              {note && <span className="block text-[11px] text-ink-faint">{note}</span>}
            </dt>
            <dd className="text-right font-mono font-medium text-ink tabular-nums">{v}</dd>
          </div>
        ))}
      </dl>
      {r.notes.length > 0 && (
        <ul className="mt-2 flex flex-col gap-1 text-xs text-warn">
          {r.notes.slice(0, 4).map((n) => (
            <li key={n.code}>• {n.message}</li>
          ))}
        </ul>
      )}
    </>
  );
}

function StoredLine({ stored, version }: { stored: StoredResult | null; version: number }) {
  if (!stored) return null;
  const current = stored.shotVersion === version;
  return (
    <p className="mt-3 border-t border-line pt-2 text-xs text-ink-muted" data-testid="stored-result">
      {stored.results ? "Stored results" : "Stored"}:{" "}
      {stored.recomputing ? "recomputing with the new calibration or stick…" : current ? `computed from version ${stored.shotVersion}` : `from version ${stored.shotVersion}, updating…`}
      {!stored.results && stored.error && <span className="block text-ink-faint">{stored.error}</span>}
    </p>
  );
}
