import { EVENTS, LANDMARKS, eventLabels, landmarkLabels } from "@shared/schemas/shots";
import type { TrackingProposals, TrackingRun, TrackStopInfo } from "@shared/schemas/tracking";
import { errorMessage } from "@/lib/api";
import { cn } from "@/lib/cn";
import { useCancelTracking, useStartTracking, useTrackingRun } from "../api/tracking";
import type { CalDraft } from "../model/calibration-draft";
import { acceptance, pendingCount } from "../model/proposals";
import type { DigitiseStore } from "../model/store";
import { eventColour, eventLetter, landmarkColour } from "../model/style";
import { markAt } from "../model/tracks";
import { Panel } from "./Panel";
import { useDigitise } from "./useDigitise";

// Auto-digitise: place the landmarks on one frame, track the whole shot on the server, then go
// through what it proposes — tracks, events, a scale bar — and accept it all, up to a frame, or
// one landmark or event at a time. Proposals are drawn apart from marks and never replace one.

interface Props {
  store: DigitiseStore;
  teamId: string;
  shotId: string;
  canEdit: boolean;
}

const btn = "h-8 rounded-md border border-line-strong px-2.5 text-sm text-ink hover:bg-sunken disabled:opacity-45 disabled:hover:bg-transparent";
const primary = "h-8 rounded-md bg-accent px-3 text-sm font-medium text-white hover:bg-accent-strong disabled:opacity-45";

export function AutoDigitisePanel({ store, teamId, shotId, canEdit }: Props) {
  const run = useTrackingRun(teamId, shotId).data?.run ?? null;
  const live = run?.status === "queued" || run?.status === "running";
  return (
    <Panel title="Auto-digitise" aside={run?.status === "done" ? <span className="text-xs text-ink-faint">seeds on frame {run.seedFrame}</span> : undefined}>
      {/* What the last run proposed comes first; seeds for another run below it. */}
      {run && !live && <Outcome run={run} store={store} canEdit={canEdit} />}
      {live && run ? <Progress run={run} teamId={teamId} shotId={shotId} canEdit={canEdit} /> : <Seeds store={store} teamId={teamId} shotId={shotId} canEdit={canEdit} again={!!run} />}
    </Panel>
  );
}

/** Seeds on this frame and the button that sends them. */
function Seeds({ store, teamId, shotId, canEdit, again }: Props & { again: boolean }) {
  const s = useDigitise(store, (st) => ({ frame: st.frame, marks: st.doc.marks, seeding: st.seeding, active: st.activeLandmark }));
  const start = useStartTracking(teamId, shotId);
  if (!canEdit) return again ? null : <p className="text-sm text-ink-muted">No tracking run for this shot yet.</p>;
  const placed = LANDMARKS.filter((k) => markAt(s.marks[k], s.frame));
  const seeds = Object.fromEntries(placed.map((k) => [k, [markAt(s.marks[k], s.frame)![1], markAt(s.marks[k], s.frame)![2]]]));
  return (
    <div className={cn("flex flex-col gap-2", again && "mt-3 border-t border-line pt-3")} data-testid="auto-seeds">
      {s.seeding ? (
        <div className="rounded-md border border-accent/40 bg-accent-soft px-3 py-2 text-sm text-ink" role="status" data-testid="seed-prompt">
          Click the <b style={{ color: "inherit" }}>{landmarkLabels[s.active].toLowerCase()}</b> on the picture.
          <span className="mt-1.5 flex gap-1.5">
            <button type="button" className={btn} onClick={() => store.skipSeed()}>
              Skip {landmarkLabels[s.active].toLowerCase()}
            </button>
            <button type="button" className={btn} onClick={() => store.stopSeeding()}>
              Done
            </button>
          </span>
        </div>
      ) : (
        !again && (
          <p className="text-sm text-ink-muted">
            Place the landmarks on one frame; the server follows each through the whole shot and proposes the events.
          </p>
        )
      )}
      <ul className="flex flex-wrap gap-1" aria-label={`Landmarks on frame ${s.frame}`}>
        {LANDMARKS.map((k) => {
          const here = placed.includes(k);
          return (
            <li key={k} className={cn("flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs", here ? "border-line-strong text-ink" : "border-dashed border-line text-ink-faint")}>
              <span aria-hidden className="size-2 rounded-full" style={{ background: here ? landmarkColour[k] : "transparent", outline: `1px solid ${landmarkColour[k]}` }} />
              {landmarkLabels[k]}
              <span className="sr-only">{here ? "placed" : "not placed"}</span>
            </li>
          );
        })}
      </ul>
      <div className="flex flex-wrap gap-1.5">
        {!s.seeding && placed.length < LANDMARKS.length && (
          <button type="button" className={btn} onClick={() => store.startSeeding()} data-testid="place-seeds">
            Place {placed.length ? "the rest" : "landmarks"} on frame {s.frame}
          </button>
        )}
        <button
          type="button"
          className={primary}
          disabled={!placed.length || start.isPending}
          onClick={() => {
            store.stopSeeding();
            start.mutate({ seedFrame: s.frame, seeds });
          }}
          data-testid="track-shot"
          title={placed.length ? `Track ${placed.length} landmark${placed.length > 1 ? "s" : ""} through the shot from frame ${s.frame}` : "Place at least one landmark on this frame first"}
        >
          {again ? "Track again" : "Track the shot"} from frame {s.frame}
        </button>
      </div>
      {start.isError && <p className="text-sm text-danger-strong" role="alert">{errorMessage(start.error)}</p>}
    </div>
  );
}

function Progress({ run, teamId, shotId, canEdit }: { run: TrackingRun; teamId: string; shotId: string; canEdit: boolean }) {
  const cancel = useCancelTracking(teamId, shotId);
  const pct = run.total ? Math.min(100, (100 * run.done) / run.total) : 0;
  const what = run.status === "queued" ? "Waiting for a worker…" : run.phase === "decoding" || !run.total ? "Decoding the shot's frames…" : `Tracking: ${run.done.toLocaleString()} of ${run.total.toLocaleString()} landmark-frames`;
  return (
    <div className="flex flex-col gap-2" data-testid="tracking-progress">
      <p className="text-sm text-ink">{what}</p>
      <div className="h-2 overflow-hidden rounded-full bg-sunken" role="progressbar" aria-label="Tracking progress" aria-valuemin={0} aria-valuemax={run.total || 1} aria-valuenow={run.done}>
        <div className="h-full rounded-full bg-accent transition-[width] duration-200" style={{ width: `${pct}%` }} />
      </div>
      {run.requestedByName && <p className="text-xs text-ink-faint">Started by {run.requestedByName}</p>}
      {canEdit && (
        <button type="button" className={cn(btn, "self-start")} onClick={() => cancel.mutate()} disabled={cancel.isPending}>
          Cancel
        </button>
      )}
    </div>
  );
}

const stopWords: Record<TrackStopInfo["reason"], string> = {
  "low-confidence": "lost",
  ambiguous: "unsure between two places",
  "left-frame": "left the picture",
  "end-of-range": "",
  cancelled: "cancelled",
};

/** Where a track stopped and why, in a few words (nothing when it reached both ends). */
function stopNote(t: { forward: TrackStopInfo; backward: TrackStopInfo }): string | null {
  const parts = [t.backward, t.forward].filter((s) => s.reason !== "end-of-range").map((s) => `${stopWords[s.reason]} at frame ${s.frame}`);
  return parts.length ? parts.join("; ") : null;
}

function Outcome({ run, store, canEdit }: { run: TrackingRun; store: DigitiseStore; canEdit: boolean }) {
  if (run.status === "failed" || run.status === "cancelled")
    return (
      <p className={cn("mt-2 text-sm", run.status === "failed" ? "text-danger-strong" : "text-ink-muted")} role={run.status === "failed" ? "alert" : undefined} data-testid="tracking-outcome">
        {run.status === "failed" ? `Tracking failed: ${run.failureReason}` : run.failureReason}
      </p>
    );
  if (!run.proposals) return null;
  return <Review p={run.proposals} store={store} canEdit={canEdit} />;
}

function Review({ p, store, canEdit }: { p: TrackingProposals; store: DigitiseStore; canEdit: boolean }) {
  const s = useDigitise(store, (st) => ({ frame: st.frame, marks: st.doc.marks, events: st.doc.events, calibration: st.doc.calibration }));
  const doc = { marks: s.marks, events: s.events };
  const tracked = LANDMARKS.filter((k) => p.tracks[k]);
  const pending = tracked.reduce((n, k) => n + pendingCount(p, s.marks, k), 0);
  const eventsPending = EVENTS.filter((k) => p.events[k] && s.events[k] === undefined);
  const bar = p.scaleBar && !s.calibration ? scaleDraft(p.scaleBar) : null;
  const nothingLeft = !pending && !eventsPending.length && !bar;
  const acceptAll = () => {
    const a = acceptance(p, doc);
    store.acceptProposals(a.marks, a.events, bar ?? undefined);
  };
  return (
    <div className="flex flex-col gap-3" data-testid="proposals">
      {canEdit && !nothingLeft && (
        <div className="flex flex-wrap gap-1.5">
          <button type="button" className={primary} onClick={acceptAll} data-testid="accept-all">
            Accept all{bar ? " with the scale bar" : ""}
          </button>
          <button
            type="button"
            className={btn}
            disabled={!pending}
            onClick={() => {
              const a = acceptance(p, doc, { upTo: s.frame });
              store.acceptProposals(a.marks, a.events);
            }}
          >
            Accept up to frame {s.frame}
          </button>
        </div>
      )}
      {nothingLeft && <p className="text-xs text-ink-muted">Everything proposed is in the shot. Move any mark or event that is off; the numbers follow.</p>}
      <ul className="flex flex-col gap-0.5" aria-label="Proposed tracks">
        {tracked.map((k) => {
          const t = p.tracks[k]!;
          const left = pendingCount(p, s.marks, k);
          const frames = t.marks.length ? `${t.marks[0][0]}–${t.marks.at(-1)![0]}` : "none";
          const note = stopNote(t);
          return (
            <li key={k} className="flex items-start gap-2 py-1 text-sm" data-testid={`proposed-${k}`}>
              <span aria-hidden className="mt-1 size-3 shrink-0 rotate-45 border-2" style={{ borderColor: landmarkColour[k] }} />
              <span className="min-w-0 flex-1">
                <span className="text-ink">{landmarkLabels[k]}</span> <span className="text-xs text-ink-muted tabular-nums">frames {frames}</span>
                {note && <span className="block text-xs text-warn">{note}</span>}
              </span>
              {canEdit &&
                (left ? (
                  <button type="button" className={cn(btn, "h-7 text-xs")} onClick={() => store.acceptProposals(acceptance(p, doc, { landmarks: [k], events: false }).marks, {})} title={`Add ${left} proposed marks of the ${landmarkLabels[k].toLowerCase()}; frames you marked stay yours`}>
                    Accept {left}
                  </button>
                ) : (
                  <span className="pt-1 text-xs text-ink-faint">accepted</span>
                ))}
            </li>
          );
        })}
      </ul>
      <ul className="flex flex-col gap-1 border-t border-line pt-2" aria-label="Proposed events">
        {EVENTS.map((k) => {
          const e = p.events[k];
          const yours = s.events[k];
          return (
            <li key={k} className="flex items-start gap-2 text-sm" data-testid={`proposed-event-${k}`}>
              <span className="mt-0.5 flex size-5 shrink-0 items-center justify-center rounded-sm text-[11px] font-bold text-[#101517]" style={{ background: eventColour[k] }}>
                {eventLetter[k]}
              </span>
              <span className="min-w-0 flex-1">
                <span className="text-ink">{eventLabels[k]}</span>{" "}
                {e ? (
                  <>
                    <button type="button" className="font-mono text-xs text-accent-strong underline-offset-2 hover:underline" onClick={() => store.goto(e.frame)}>
                      frame {e.frame}
                    </button>{" "}
                    <span className="text-xs text-ink-muted" title="How clearly the tracks put it on this frame rather than the next either side">
                      {Math.round(e.confidence * 100)} % sure
                    </span>
                    <span className="block text-xs text-ink-muted">{e.evidence}</span>
                  </>
                ) : (
                  <span className="text-xs text-ink-faint">not found in the tracks</span>
                )}
              </span>
              {canEdit && e && (yours === undefined ? (
                <button type="button" className={cn(btn, "h-7 text-xs")} onClick={() => store.setEvent(k, e.frame)}>
                  Set
                </button>
              ) : (
                <span className="pt-0.5 text-xs text-ink-faint">{yours === e.frame ? "set" : `yours: ${yours}`}</span>
              ))}
            </li>
          );
        })}
      </ul>
      {(p.scaleBar || p.scaleBarNote) && !s.calibration && (
        <div className="border-t border-line pt-2 text-sm" data-testid="proposed-scale">
          {p.scaleBar ? (
            <span className="flex items-center gap-2">
              <span className="flex-1 text-ink">
                Scale bar from the puck on frame {p.scaleBar.frame}: {p.scaleBar.widthPx.toFixed(1)} px = 76.2 mm
              </span>
              {canEdit && (
                <button type="button" className={cn(btn, "h-7 text-xs")} onClick={() => store.setCalibration(scaleDraft(p.scaleBar!))}>
                  Use
                </button>
              )}
            </span>
          ) : (
            <span className="text-xs text-ink-muted">{p.scaleBarNote}</span>
          )}
        </div>
      )}
    </div>
  );
}

function scaleDraft(b: NonNullable<TrackingProposals["scaleBar"]>): CalDraft {
  return { type: "scaleBar", a: [b.a[0], b.a[1]], b: [b.b[0], b.b[1]], length: b.lengthMm, unit: "mm" };
}
