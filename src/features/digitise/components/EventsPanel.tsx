import { EVENTS, eventLabels } from "@shared/schemas/shots";
import type { DigitiseStore } from "../model/store";
import { eventColour, eventLetter } from "../model/style";
import { formatMs, msSince } from "../model/timing";
import { Kbd, Panel } from "./Panel";
import { useDigitise } from "./useDigitise";

/** The four events: set to this frame by key or button, jump to, clear; with the timing between them. */
export function EventsPanel({ store }: { store: DigitiseStore }) {
  const s = useDigitise(store, (st) => ({ frame: st.frame, events: st.doc.events, readOnly: st.readOnly, fps: st.captureFps, clock: st.clock }));
  const e = s.events;
  const span = (a?: number, b?: number) => (a !== undefined && b !== undefined ? formatMs(msSince(b, a, s.clock), s.fps).replace(/^\+/, "") : "—");
  return (
    <Panel title="Events">
      <ul className="flex flex-col gap-1">
        {EVENTS.map((k) => {
          const f = e[k];
          const here = f === s.frame;
          return (
            <li key={k} className="flex h-8 items-center gap-2 text-sm" data-testid={`event-${k}`}>
              <span className="flex size-5 items-center justify-center rounded-sm text-[11px] font-bold text-[#101517]" style={{ background: eventColour[k] }}>
                {eventLetter[k]}
              </span>
              <span className="flex-1 text-ink">{eventLabels[k]}</span>
              {f === undefined ? (
                <span className="text-xs text-ink-faint">not set</span>
              ) : (
                <button type="button" className="font-mono text-xs text-accent-strong underline-offset-2 hover:underline" onClick={() => store.goto(f)} title={`Go to frame ${f} (Shift + ${eventLetter[k]})`}>
                  frame {f}
                </button>
              )}
              {!s.readOnly && (
                <button
                  type="button"
                  onClick={() => store.toggleEvent(k)}
                  className="h-7 min-w-[4.75rem] rounded-md border border-line-strong px-2 text-xs text-ink hover:bg-sunken"
                  title={here ? `Clear ${eventLabels[k].toLowerCase()} (${eventLetter[k]})` : `Set ${eventLabels[k].toLowerCase()} to frame ${s.frame} (${eventLetter[k]})`}
                >
                  {here ? "Clear" : "Set here"} <Kbd>{eventLetter[k]}</Kbd>
                </button>
              )}
            </li>
          );
        })}
      </ul>
      <dl className="mt-2 grid grid-cols-2 gap-x-3 text-xs text-ink-muted">
        <dt>Load (ice → puck strike)</dt>
        <dd className="text-right font-mono text-ink tabular-nums">{span(e.iceStrike, e.puckStrike)}</dd>
        <dt>Contact (strike → release)</dt>
        <dd className="text-right font-mono text-ink tabular-nums">{span(e.puckStrike, e.release)}</dd>
      </dl>
    </Panel>
  );
}
