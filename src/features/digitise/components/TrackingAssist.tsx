import { useEffect, useMemo, useRef, useSyncExternalStore } from "react";
import { Group, Line, Rect, Text } from "react-konva";
import { landmarkLabels } from "@shared/schemas/shots";
import { env } from "@/lib/env";
import type { DigitiseStore } from "../model/store";
import { landmarkColour } from "../model/style";
import { markAt, lowerBound } from "../model/tracks";
import { TrackingSession } from "../model/tracking-session";
import { toScreen } from "../model/viewport";
import { createTrackingClient, type TrackingClient, type TrackRun } from "../tracking/client";
import { Kbd } from "./Panel";
import { useDigitise } from "./useDigitise";

interface Setup {
  teamId: string;
  clipId: string;
  frameStart: number;
  frameEnd: number;
  enabled: boolean;
}

/** The tracking assist wired to the page: worker client, session, and the store's click hook. */
export function useTrackingAssist(store: DigitiseStore, o: Setup) {
  const client = useRef<TrackingClient | null>(null);
  const run = useRef<TrackRun | null>(null);
  const session = useMemo(
    () =>
      new TrackingSession({
        accept: (l, marks) => store.placeMany(l, marks),
        cancelRun: () => run.current?.cancel(),
        run: (landmark, start) => {
          client.current ??= createTrackingClient();
          const track = store.getState().doc.marks[landmark] ?? [];
          const i = lowerBound(track, start[0]);
          const prior = i > 0 ? track[i - 1] : undefined;
          const r = client.current.start(
            {
              frames: { urlTemplate: `${env.apiBase}/teams/${encodeURIComponent(o.teamId)}/clips/${encodeURIComponent(o.clipId)}/frames/{frame}`, first: o.frameStart, last: o.frameEnd },
              start: { frame: start[0], x: start[1], y: start[2] },
              ...(prior && start[0] - prior[0] <= 3 ? { prior: { frame: prior[0], x: prior[1], y: prior[2] } } : {}),
              // The puck is followed by its outline alone (the blade beside it, a print on it take no part).
              options: { direction: 1, ...(landmark === "puck" ? { object: "puck" as const } : {}) },
            },
            {
              onProposal: (p) => session.proposal({ frame: p.frame, x: p.x, y: p.y, confidence: p.confidence }),
              onProgress: (done, total) => session.progress(done, total),
            },
          );
          run.current = r;
          r.finished.then(
            (d) => run.current === r && session.finished(d.message),
            (e: Error) => run.current === r && session.failed(`Tracking stopped: ${e.message}`),
          );
        },
      }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [store],
  );
  const state = useSyncExternalStore(session.subscribe, session.getState, session.getState);

  useEffect(() => {
    store.placeHandler = (l, f, at) => session.correct(l, f, at);
    return () => {
      store.placeHandler = null;
      client.current?.dispose();
    };
  }, [store, session]);

  return {
    state,
    session,
    busy: state.mode === "running",
    enabled: o.enabled,
    start() {
      if (!o.enabled) return;
      const s = store.getState();
      const m = markAt(s.doc.marks[s.activeLandmark], s.frame);
      if (!m) return store.notify(`Place ${landmarkLabels[s.activeLandmark].toLowerCase()} on this frame first; tracking goes forward from it.`, "info");
      if (s.frame >= s.frameEnd) return store.notify("This is the shot's last frame: nothing to track forward into.", "info");
      session.start(s.activeLandmark, m, s.frameEnd - s.frame);
    },
    cancel: () => session.cancel(),
  };
}
export type TrackingAssist = ReturnType<typeof useTrackingAssist>;

export function TrackingButton({ tracking }: { tracking: TrackingAssist }) {
  if (!tracking.enabled) return null;
  return (
    <button
      type="button"
      onClick={() => tracking.start()}
      disabled={tracking.busy}
      className="h-8 rounded-md border border-accent/50 bg-accent-soft px-2.5 text-sm font-medium text-accent-strong hover:bg-accent/15 disabled:opacity-50"
      title="Propose this landmark's position on the next frames, starting from its mark on this frame (T)"
    >
      Track forward <Kbd>T</Kbd>
    </button>
  );
}

/** Progress while a run goes; the review choices once it stops. */
export function TrackingBar({ store, tracking }: { store: DigitiseStore; tracking: TrackingAssist }) {
  const frame = useDigitise(store, (s) => s.frame);
  const s = tracking.state;
  if (s.mode === "idle") {
    if (!s.lastMessage) return null;
    return (
      <div className="flex items-center gap-3 border-t border-[#263034] bg-[#161d20] px-3 py-1.5 text-[12px] text-[#9aa6a4]">
        <span className="flex-1">{s.lastMessage}</span>
      </div>
    );
  }
  const colour = landmarkColour[s.landmark];
  if (s.mode === "running") {
    const pct = s.total ? Math.min(100, (100 * s.done) / s.total) : 0;
    return (
      <div className="flex items-center gap-3 border-t border-[#263034] bg-[#161d20] px-3 py-2 text-[13px] text-[#dfe6e3]" data-testid="tracking-running">
        <span>
          Tracking <b style={{ color: colour }}>{landmarkLabels[s.landmark]}</b> from frame {s.from}
        </span>
        <div className="h-2 flex-1 overflow-hidden rounded-full bg-[#263034]" role="progressbar" aria-valuemin={0} aria-valuemax={s.total} aria-valuenow={s.done} aria-label="Tracking progress">
          <div className="h-full rounded-full transition-[width] duration-150" style={{ width: `${pct}%`, background: colour }} />
        </div>
        <span className="font-mono tabular-nums">
          {s.done}/{s.total}
        </span>
        <button type="button" onClick={() => tracking.cancel()} className="h-7 rounded border border-[#41504e] px-2 hover:bg-white/10">
          Cancel <span className="text-[#9aa6a4]">Esc</span>
        </button>
      </div>
    );
  }
  const first = s.proposals[0]?.frame;
  const last = s.proposals.at(-1)?.frame;
  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-1.5 border-t border-[#263034] bg-[#1d2427] px-3 py-2 text-[13px] text-[#dfe6e3]" data-testid="tracking-review">
      <span>
        <b style={{ color: colour }}>{s.proposals.length}</b> proposed {landmarkLabels[s.landmark].toLowerCase()} marks, frames {first}–{last}. <span className="text-[#9aa6a4]">{s.message}</span>
      </span>
      <span className="text-[12px] text-[#9aa6a4]">Click the right spot on any proposed frame to correct it and track on from there.</span>
      <div className="ml-auto flex gap-1.5">
        <button type="button" className="h-7 rounded bg-[#f3c969] px-2.5 font-medium text-[#101517] hover:brightness-105" onClick={() => tracking.session.acceptAll()}>
          Accept all
        </button>
        <button
          type="button"
          className="h-7 rounded border border-[#41504e] px-2.5 hover:bg-white/10 disabled:opacity-40"
          disabled={first === undefined || frame < first}
          onClick={() => tracking.session.acceptUpTo(frame)}
        >
          Accept up to frame {frame}
        </button>
        <button type="button" className="h-7 rounded px-2.5 text-[#ffb199] hover:bg-white/10" onClick={() => tracking.session.discard()}>
          Discard
        </button>
      </div>
    </div>
  );
}

/** Proposals: dashed path and hollow diamonds, never the rings of confirmed marks. */
export function TrackingOverlay({ store, tracking }: { store: DigitiseStore; tracking: TrackingAssist }) {
  const s = useDigitise(store, (st) => ({ view: st.view, frame: st.frame }));
  const t = tracking.state;
  if (t.mode === "idle" || !t.proposals.length) return null;
  const colour = landmarkColour[t.landmark];
  const pts = t.proposals.map((p) => toScreen(s.view, [p.x, p.y]));
  const here = t.proposals.find((p) => p.frame === s.frame);
  const h = here ? toScreen(s.view, [here.x, here.y]) : null;
  return (
    <Group>
      <Line points={pts.flat()} stroke={colour} strokeWidth={1} dash={[3, 4]} opacity={0.8} />
      {pts.map((p, i) => (
        <Rect key={i} x={p[0]} y={p[1]} width={4} height={4} offsetX={2} offsetY={2} rotation={45} stroke={colour} strokeWidth={1} opacity={0.7} />
      ))}
      {h && here && (
        <Group x={h[0]} y={h[1]}>
          <Rect width={14} height={14} offsetX={7} offsetY={7} rotation={45} stroke={colour} strokeWidth={1.75} dash={[3, 2]} />
          <Text x={12} y={6} text={`proposed · ${Math.round(here.confidence * 100)}%`} fontSize={11} fill={colour} fontFamily="IBM Plex Sans, sans-serif" shadowColor="#000" shadowBlur={3} shadowOpacity={0.9} />
        </Group>
      )}
    </Group>
  );
}
