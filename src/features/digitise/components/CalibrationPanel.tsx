import { useEffect, useRef, useState } from "react";
import { PUCK_DIAMETER_MM } from "@shared/schemas/shots";
import { cn } from "@/lib/cn";
import { checkDraft, newPlane, newScaleBar, scaleOf, type CalDraft, type LengthUnit } from "../model/calibration-draft";
import type { DigitiseStore } from "../model/store";
import { Kbd, Panel } from "./Panel";
import { useDigitise } from "./useDigitise";

/** Scale bar or plane for the whole clip: pick the tool, type the known length or positions. */
export function CalibrationPanel({ store, status }: { store: DigitiseStore; status: string | null }) {
  const s = useDigitise(store, (st) => ({ cal: st.doc.calibration, tool: st.tool, readOnly: st.readOnly, frameSize: st.frameSize }));
  const check = checkDraft(s.cal, s.frameSize);
  const set = (c: CalDraft | null) => store.setCalibration(c);
  const box = useRef<HTMLDivElement>(null);
  const clicked = s.cal?.type === "scaleBar" ? (s.cal.a ? 1 : 0) + (s.cal.b ? 1 : 0) : (s.cal?.points.length ?? 0);
  const complete = s.cal?.type === "scaleBar" && clicked === 2;
  // Once points are clicked on the picture, the fields they need (the length, each point's
  // position) come into view. With the panels beside the picture only the panel column scrolls;
  // below it (phones) the page scrolls, so that waits until the scale bar's two ends are in.
  useEffect(() => {
    if (s.tool === "mark" || clicked === 0) return;
    const beside = window.matchMedia("(min-width: 64rem)").matches;
    if (beside || complete) box.current?.scrollIntoView({ block: "nearest", behavior: "smooth" });
  }, [clicked, complete, s.tool]);

  return (
    <div ref={box} className="scroll-mb-4">
      <Panel title="Calibration" aside={status && <span className="text-xs text-ink-faint">{status}</span>}>
        {!s.readOnly && (
          <div className="mb-2 flex gap-1.5" role="group" aria-label="Calibration tool">
            <ToolButton active={s.tool === "scaleBar"} onClick={() => store.setTool(s.tool === "scaleBar" ? "mark" : "scaleBar")} keyName="S">
              Scale bar
            </ToolButton>
            <ToolButton active={s.tool === "plane"} onClick={() => store.setTool(s.tool === "plane" ? "mark" : "plane")} keyName="L">
              Plane layout
            </ToolButton>
            {s.tool !== "mark" && (
              <button type="button" className="ml-auto h-8 rounded-md px-2 text-sm text-accent-strong hover:bg-accent-soft" onClick={() => store.setTool("mark")}>
                Done <Kbd>Esc</Kbd>
              </button>
            )}
          </div>
        )}

        {!s.cal && <p className="text-sm text-ink-muted">None set for this clip. {s.readOnly ? "" : "Pick a tool, then click on the frame."}</p>}

        {s.cal?.type === "scaleBar" && <ScaleBarEditor cal={s.cal} readOnly={s.readOnly} onChange={set} />}
        {s.cal?.type === "plane" && <PlaneEditor cal={s.cal} readOnly={s.readOnly} onChange={set} />}

        {check.state === "incomplete" && <p className="mt-2 text-sm text-warn">{check.message}</p>}
        {check.state === "invalid" && (
          <p className="mt-2 text-sm text-danger" role="alert">
            Not saved: {check.message}
          </p>
        )}
        {check.state === "ready" && check.calibration.type === "scaleBar" && (
          <p className="mt-2 text-xs text-ink-muted">
            {scaleOf(check.calibration)!.toFixed(3)} mm per pixel, for every shot in this clip.
          </p>
        )}
        {check.state === "ready" && check.calibration.type === "plane" && <p className="mt-2 text-xs text-ink-muted">{check.calibration.points.length} points map the frame onto the plane of the shot.</p>}
        {s.cal && !s.readOnly && (
          <div className="mt-2 flex gap-2">
            <button type="button" className="text-xs text-danger hover:underline" onClick={() => set(null)}>
              Clear calibration
            </button>
            <button type="button" className="text-xs text-ink-muted hover:underline" onClick={() => set(s.cal!.type === "scaleBar" ? newPlane() : newScaleBar())}>
              Use a {s.cal.type === "scaleBar" ? "plane" : "scale bar"} instead
            </button>
          </div>
        )}
      </Panel>
    </div>
  );
}

function ToolButton({ active, onClick, keyName, children }: { active: boolean; onClick: () => void; keyName: string; children: React.ReactNode }) {
  return (
    <button
      type="button"
      aria-pressed={active}
      onClick={onClick}
      className={cn("inline-flex h-8 items-center gap-1.5 rounded-md border px-2.5 text-sm", active ? "border-accent bg-accent text-accent-ink" : "border-line-strong text-ink hover:bg-sunken")}
    >
      {children}
      <kbd className={cn("rounded border px-1 font-mono text-[11px]", active ? "border-white/40" : "border-line-strong text-ink-muted")}>{keyName}</kbd>
    </button>
  );
}

/** A number field that keeps what is being typed and reports only finite numbers. */
function NumberField({ value, onChange, label, disabled, className }: { value: number | null; onChange: (v: number) => void; label: string; disabled?: boolean; className?: string }) {
  const [text, setText] = useState(value === null ? "" : String(value));
  useEffect(() => setText(value === null ? "" : String(value)), [value]);
  return (
    <input
      aria-label={label}
      inputMode="decimal"
      disabled={disabled}
      value={text}
      onChange={(e) => setText(e.target.value)}
      onBlur={() => {
        const v = Number(text.replace(",", "."));
        if (text.trim() !== "" && Number.isFinite(v)) onChange(v);
        else setText(value === null ? "" : String(value));
      }}
      onKeyDown={(e) => e.key === "Enter" && (e.target as HTMLInputElement).blur()}
      className={cn("h-7 rounded-md border border-line-strong bg-surface px-2 font-mono text-sm text-ink tabular-nums disabled:bg-sunken", className)}
    />
  );
}

function ScaleBarEditor({ cal, readOnly, onChange }: { cal: Extract<CalDraft, { type: "scaleBar" }>; readOnly: boolean; onChange: (c: CalDraft) => void }) {
  const fmt = (p: [number, number] | null) => (p ? `${p[0].toFixed(1)}, ${p[1].toFixed(1)}` : "—");
  return (
    <div className="flex flex-col gap-2 text-sm">
      <div className="flex items-center gap-2">
        <span className="w-24 text-ink-muted">Known length</span>
        <NumberField label="Known length" value={cal.length} disabled={readOnly} onChange={(length) => onChange({ ...cal, length })} className="w-24" />
        <select
          aria-label="Length unit"
          disabled={readOnly}
          value={cal.unit}
          onChange={(e) => onChange({ ...cal, unit: e.target.value as LengthUnit })}
          className="h-7 rounded-md border border-line-strong bg-surface px-1 text-ink"
        >
          <option value="mm">mm</option>
          <option value="in">in</option>
        </select>
      </div>
      {!readOnly && (
        <button type="button" className="w-fit text-xs text-accent-strong hover:underline" onClick={() => onChange({ ...cal, length: PUCK_DIAMETER_MM, unit: "mm" })}>
          Use a puck's diameter (76.2 mm)
        </button>
      )}
      <p className="font-mono text-xs text-ink-muted">
        ends: ({fmt(cal.a)}) → ({fmt(cal.b)}) px
      </p>
    </div>
  );
}

function PlaneEditor({ cal, readOnly, onChange }: { cal: Extract<CalDraft, { type: "plane" }>; readOnly: boolean; onChange: (c: CalDraft) => void }) {
  const setWorld = (i: number, axis: 0 | 1, v: number) =>
    onChange({
      ...cal,
      points: cal.points.map((p, j) => (j === i ? { ...p, world: (axis === 0 ? [v, p.world?.[1] ?? 0] : [p.world?.[0] ?? 0, v]) as [number, number] } : p)),
    });
  if (!cal.points.length) return <p className="text-sm text-ink-muted">Click the corners of something of known size on the plane of the shot (at least 4).</p>;
  return (
    <table className="w-full text-sm">
      <thead>
        <tr className="text-left text-xs text-ink-faint">
          <th className="font-normal">#</th>
          <th className="font-normal">image px</th>
          <th className="font-normal">X mm</th>
          <th className="font-normal">Y mm</th>
          <th />
        </tr>
      </thead>
      <tbody>
        {cal.points.map((p, i) => (
          <tr key={i}>
            <td className="pr-1 text-ink-muted">{i + 1}</td>
            <td className="pr-1 font-mono text-xs text-ink-muted">
              {p.image[0].toFixed(0)}, {p.image[1].toFixed(0)}
            </td>
            <td className="py-0.5 pr-1">
              <NumberField label={`Point ${i + 1} X in mm`} value={p.world?.[0] ?? null} disabled={readOnly} onChange={(v) => setWorld(i, 0, v)} className="w-20" />
            </td>
            <td className="py-0.5 pr-1">
              <NumberField label={`Point ${i + 1} Y in mm`} value={p.world?.[1] ?? null} disabled={readOnly} onChange={(v) => setWorld(i, 1, v)} className="w-20" />
            </td>
            <td>
              {!readOnly && (
                <button type="button" aria-label={`Remove point ${i + 1}`} className="rounded px-1 text-ink-faint hover:text-danger" onClick={() => onChange({ ...cal, points: cal.points.filter((_, j) => j !== i) })}>
                  ×
                </button>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
