import { Fragment } from "react";
import { createPortal } from "react-dom";
import { bindings, type Binding } from "../model/keymap";
import { LANDMARKS, landmarkLabels } from "@shared/schemas/shots";

const GROUPS: Binding["group"][] = ["Frames", "Playback", "Landmarks", "Events", "View", "Tools", "Editing"];

const mouse: [string, string][] = [
  ["Click", "Place the active landmark (or a calibration point) at the pointer"],
  ["Drag a mark", "Correct it; it keeps the offset you grabbed it at"],
  ["Drag empty picture", "Pan (also the right button, or Alt + drag over a mark)"],
  ["Wheel", "Zoom at the pointer"],
  ["Frame strip", "Press and drag to scrub"],
];

/** Every shortcut of the page, from the same table the key handler uses. */
export function HelpOverlay({ onClose, readOnly }: { onClose: () => void; readOnly: boolean }) {
  // On <body>: the workspace is transformed, which would make `fixed` relative to it.
  return createPortal(
    <div className="fixed inset-0 z-40 flex items-center justify-center bg-[#0b0f10]/70 p-4" onClick={onClose} role="presentation">
      <div
        role="dialog"
        aria-modal="true"
        aria-labelledby="keys-title"
        className="max-h-[90dvh] w-[min(60rem,100%)] overflow-y-auto rounded-[var(--radius-card)] bg-surface p-6 shadow-[var(--shadow-pop)]"
        onClick={(e) => e.stopPropagation()}
      >
        <div className="mb-4 flex items-baseline justify-between gap-4">
          <h2 id="keys-title" className="text-lg font-semibold text-ink">
            Keys and mouse
          </h2>
          <button type="button" onClick={onClose} className="text-sm text-accent-strong hover:underline">
            Close <kbd className="ml-1 rounded border border-line-strong px-1 font-mono text-[11px]">Esc</kbd>
          </button>
        </div>
        {readOnly && <p className="mb-3 text-sm text-ink-muted">This shot is read-only for you: the editing keys are listed but do nothing.</p>}
        <div className="columns-1 gap-8 sm:columns-2 lg:columns-3">
          {GROUPS.map((g) => (
            <section key={g} className="mb-5 break-inside-avoid">
              <h3 className="mb-1.5 text-xs font-semibold tracking-wide text-ink-faint uppercase">{g}</h3>
              <dl className="grid grid-cols-[auto_1fr] items-baseline gap-x-3 gap-y-1 text-sm">
                {bindings
                  .filter((b) => b.group === g)
                  .map((b) => (
                    <Fragment key={b.command}>
                      <dt className="flex gap-0.5 whitespace-nowrap">
                        {b.keys.map((k) => (
                          <kbd key={k} className="rounded border border-line-strong bg-sunken px-1.5 font-mono text-[11px] text-ink">
                            {k}
                          </kbd>
                        ))}
                      </dt>
                      <dd className={readOnly && !b.viewing ? "text-ink-faint line-through" : "text-ink-muted"}>
                        {b.command.startsWith("landmark:") ? `Pick ${landmarkLabels[b.command.slice(9) as (typeof LANDMARKS)[number]].toLowerCase()}` : b.description}
                      </dd>
                    </Fragment>
                  ))}
              </dl>
            </section>
          ))}
          <section className="mb-5 break-inside-avoid">
            <h3 className="mb-1.5 text-xs font-semibold tracking-wide text-ink-faint uppercase">Mouse</h3>
            <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
              {mouse.map(([k, v]) => (
                <Fragment key={k}>
                  <dt className="font-medium whitespace-nowrap text-ink">{k}</dt>
                  <dd className="text-ink-muted">{v}</dd>
                </Fragment>
              ))}
            </dl>
          </section>
        </div>
      </div>
    </div>,
    document.body,
  );
}
