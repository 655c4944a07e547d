import { LANDMARKS, landmarkLabels } from "@shared/schemas/shots";
import { cn } from "@/lib/cn";
import { TRAIL_CHOICES, type DigitiseStore } from "../model/store";
import { landmarkColour } from "../model/style";
import { markAt } from "../model/tracks";
import { Kbd, Panel } from "./Panel";
import { useDigitise } from "./useDigitise";

/** Pick the landmark to place, see what is marked, show or hide each one. */
export function LandmarkPanel({ store, tracking }: { store: DigitiseStore; tracking?: React.ReactNode }) {
  const s = useDigitise(store, (st) => ({
    frame: st.frame, marks: st.doc.marks, active: st.activeLandmark, visible: st.visible, trail: st.trail, autoAdvance: st.autoAdvance, readOnly: st.readOnly, tool: st.tool,
  }));
  return (
    <Panel title="Landmarks" aside={<span className="text-xs text-ink-faint">frame {s.frame}</span>}>
      {/* Each row: one button that picks the landmark (pressed = active) and one that hides or shows it. */}
      <ul className="flex flex-col gap-0.5" aria-label="Landmark to place">
        {LANDMARKS.map((l, i) => {
          const here = markAt(s.marks[l], s.frame);
          const active = l === s.active && s.tool === "mark";
          return (
            <li key={l} className={cn("flex items-center gap-1 rounded-md pr-1 text-sm", active ? "bg-accent-soft ring-1 ring-accent/40" : "hover:bg-sunken")}>
              <button
                type="button"
                aria-pressed={active}
                className="flex h-9 min-w-0 flex-1 cursor-pointer items-center gap-2 rounded-md pl-2 text-left"
                onClick={() => store.setActiveLandmark(l)}
                data-testid={`landmark-${l}`}
                data-count={s.marks[l]?.length ?? 0}
              >
                <Kbd>{i + 1}</Kbd>
                <span aria-hidden className="size-3 shrink-0 rounded-full ring-1 ring-black/20" style={{ background: landmarkColour[l] }} />
                <span className={cn("flex-1 truncate", active ? "font-semibold text-ink" : "text-ink")}>{landmarkLabels[l]}</span>
                <span className="w-16 text-right text-xs text-ink-muted tabular-nums" title={`${s.marks[l]?.length ?? 0} frames marked`}>
                  {here ? (
                    <span className="font-mono text-ink" title={`x ${here[1].toFixed(2)}, y ${here[2].toFixed(2)} px`}>
                      ● {s.marks[l]?.length}
                    </span>
                  ) : (
                    <span>{s.marks[l]?.length ? `○ ${s.marks[l]!.length}` : "—"}</span>
                  )}
                </span>
              </button>
              <button
                type="button"
                className="rounded p-1 text-ink-faint hover:bg-surface hover:text-ink"
                aria-label={`${s.visible[l] ? "Hide" : "Show"} ${landmarkLabels[l]}`}
                title={`${s.visible[l] ? "Hide" : "Show"} (H for the active one)`}
                aria-pressed={!s.visible[l]}
                onClick={() => store.toggleVisible(l)}
              >
                <Eye open={s.visible[l]} />
              </button>
            </li>
          );
        })}
      </ul>
      <div className="mt-3 flex flex-wrap items-center gap-x-4 gap-y-2 text-sm text-ink-muted">
        <label className="flex items-center gap-1.5">
          Trail
          <select value={s.trail} onChange={(e) => store.setTrail(Number(e.target.value))} className="h-7 rounded-md border border-line-strong bg-surface px-1 text-ink" aria-label="Trail length">
            {TRAIL_CHOICES.map((n) => (
              <option key={n} value={n}>
                {n === 0 ? "off" : `${n} frames`}
              </option>
            ))}
          </select>
          <Kbd>V</Kbd>
        </label>
        {!s.readOnly && (
          <label className="flex items-center gap-1.5">
            <input type="checkbox" checked={s.autoAdvance} onChange={(e) => store.setAutoAdvance(e.target.checked)} className="size-4 accent-[var(--color-accent)]" />
            Next frame after a click <Kbd>A</Kbd>
          </label>
        )}
      </div>
      {!s.readOnly && (
        <div className="mt-3 flex flex-wrap gap-2">
          <button
            type="button"
            onClick={() => store.deleteMark()}
            disabled={!markAt(s.marks[s.active], s.frame)}
            className="h-8 rounded-md border border-line-strong px-2.5 text-sm text-ink hover:bg-sunken disabled:opacity-45"
          >
            Delete this mark <span className="text-ink-faint">Del</span>
          </button>
          {tracking}
        </div>
      )}
    </Panel>
  );
}

function Eye({ open }: { open: boolean }) {
  return (
    <svg viewBox="0 0 20 20" className="size-4" aria-hidden fill="none" stroke="currentColor" strokeWidth="1.6">
      <path d="M1.8 10s3-5.6 8.2-5.6S18.2 10 18.2 10s-3 5.6-8.2 5.6S1.8 10 1.8 10Z" />
      {open ? <circle cx="10" cy="10" r="2.6" /> : <path d="M3 17 17 3" />}
    </svg>
  );
}
