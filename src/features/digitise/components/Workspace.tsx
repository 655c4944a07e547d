import { useEffect, useMemo, useState } from "react";
import { Link, useSearchParams } from "react-router-dom";
import { eventLabels, landmarkLabels, type Landmark, type ShotDetail, type ShotEventKey } from "@shared/schemas/shots";
import { frameClock } from "@shared/frame-clock";
import { Button } from "@/components/ui";
import { formatDateTime } from "@/lib/format";
import { frameUrl } from "@/components/shot/frames";
import { capacityFor, FrameCache } from "@/components/shot/stepping/frame-cache";
import { createFrameLoader } from "@/components/shot/stepping/frame-loader";
import { isFrameCommand, runFrameCommand } from "@/components/shot/stepping/frame-keys";
import type { MergePart } from "../model/merge";
import { checkDraft } from "../model/calibration-draft";
import { commandFor, isTypingTarget, type Command } from "../model/keymap";
import { DigitiseStore } from "../model/store";
import { shotIrregularities } from "../model/timing";
import { usePreview } from "../preview/usePreview";
import { useTrackingRun } from "../api/tracking";
import { AutoDigitisePanel } from "./AutoDigitisePanel";
import { CalibrationPanel } from "./CalibrationPanel";
import { ProposalsOverlay } from "./ProposalsOverlay";
import { EventsPanel } from "./EventsPanel";
import { FrameStrip } from "./FrameStrip";
import { FrameViewer } from "./FrameViewer";
import { HelpOverlay } from "./HelpOverlay";
import { LandmarkPanel } from "./LandmarkPanel";
import { PreviewPanel } from "./PreviewPanel";
import { SaveIndicator } from "./SaveIndicator";
import { TrackingBar, TrackingButton, TrackingOverlay, useTrackingAssist } from "./TrackingAssist";
import { Transport } from "./Transport";
import { useDigitise } from "./useDigitise";
import { usePlayback } from "./usePlayback";
import { initialDoc, useShotSaving } from "./useShotSaving";

/** The Digitise page for one shot: frame viewer, transport and strip on the left, panels on the right. */
const partsText = (parts: MergePart[]) => parts.map((p) => (p in landmarkLabels ? landmarkLabels[p as Landmark] : eventLabels[p as ShotEventKey]).toLowerCase()).join(", ");
const overlapText = (parts: MergePart[]) => (parts.length ? `, and you both changed the ${partsText(parts)}` : "");

export function Workspace({ teamId, shot }: { teamId: string; shot: ShotDetail }) {
  const [search] = useSearchParams();
  const [start] = useState(() => initialDoc(shot));
  const { width, height } = shot.clip;
  const [store] = useState(
    () =>
      new DigitiseStore({
        readOnly: !shot.canEdit,
        frameSize: { width, height },
        frameStart: shot.frameStart,
        frameEnd: shot.frameEnd,
        captureFps: shot.clip.captureFps,
        clock: frameClock(shot.frameTimes, shot.clip.captureFps),
        startMs: shot.startS * 1000,
        doc: start.doc,
        frame: Number(search.get("frame")) || undefined,
      }),
  );
  const [url] = useState(() => (f: number) => frameUrl(teamId, shot.clip.id, f));
  // Made in an effect (not at render) so a remount, as React's strict mode does in development, gets a live pair.
  const [frames, setFrames] = useState<FrameCache<ImageBitmap> | null>(null);
  useEffect(() => {
    const loader = createFrameLoader();
    const cache = new FrameCache<ImageBitmap>({
      load: (f, signal) => loader.load(url(f), signal), first: shot.frameStart, last: shot.frameEnd, capacity: capacityFor(width, height), ahead: 32, behind: 10,
    });
    setFrames(cache);
    return () => {
      cache.dispose();
      loader.dispose();
    };
  }, [url, shot.frameStart, shot.frameEnd, width, height]);

  const saving = useShotSaving(teamId, shot, store, start);
  const playback = usePlayback(store);
  const tracking = useTrackingAssist(store, { teamId, clipId: shot.clip.id, frameStart: shot.frameStart, frameEnd: shot.frameEnd, enabled: shot.canEdit });
  const trackingRun = useTrackingRun(teamId, shot.id);
  const [help, setHelp] = useState(false);
  const [jumpRequest, setJumpRequest] = useState(0);

  const doc = useDigitise(store, (s) => ({ d: s.doc })).d;
  const check = checkDraft(doc.calibration, { width, height });
  const calibrated = check.state === "ready";
  const parts = useMemo(
    () => ({
      captureFps: shot.clip.captureFps,
      calibration: check.state === "ready" ? check.calibration : null,
      marks: doc.marks,
      events: doc.events,
      frameStart: shot.frameStart,
      frameEnd: shot.frameEnd,
      stick: shot.stick?.flex ? { flex: shot.stick.flex, benchSpanMm: shot.stick.benchSpanMm } : null,
      frameTimes: shot.frameTimes,
    }),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [doc],
  );
  const preview = usePreview(parts);
  const irregular = useMemo(() => shotIrregularities(shot.frameTimes, shot.clip.captureFps), [shot.frameTimes, shot.clip.captureFps]);

  useEffect(() => {
    const run = (c: Command) => {
      if (c !== "play" && c !== "playBack" && c !== "slower" && c !== "faster" && c !== "help") playback.stop();
      if (c.startsWith("landmark:")) return store.setActiveLandmark(c.slice(9) as Parameters<DigitiseStore["setActiveLandmark"]>[0]);
      if (c.startsWith("event:")) return void store.toggleEvent(c.slice(6) as Parameters<DigitiseStore["toggleEvent"]>[0]);
      if (c.startsWith("gotoEvent:")) return store.gotoEvent(c.slice(10) as Parameters<DigitiseStore["gotoEvent"]>[0]);
      const st = store.getState();
      if (isFrameCommand(c)) return runFrameCommand(c, store, { first: st.frameStart, last: st.frameEnd });
      const actions: Partial<Record<Command, () => void>> = {
        jump: () => setJumpRequest((n) => n + 1),
        prevMark: () => store.gotoNeighbourMark(-1),
        nextMark: () => store.gotoNeighbourMark(1),
        play: () => playback.toggle(1),
        playBack: () => playback.toggle(-1),
        slower: playback.slower,
        faster: playback.faster,
        nextLandmark: () => store.cycleLandmark(1),
        prevLandmark: () => store.cycleLandmark(-1),
        deleteMark: () => void store.deleteMark(),
        toggleVisible: () => store.toggleVisible(),
        showAll: () => store.showAll(),
        trail: () => store.cycleTrail(),
        autoAdvance: () => store.setAutoAdvance(!st.autoAdvance),
        track: () => tracking.start(),
        zoomIn: () => store.zoomBy(1.25),
        zoomOut: () => store.zoomBy(1 / 1.25),
        fit: () => store.fit(),
        original: () => store.originalPixels(),
        toolMark: () => store.setTool("mark"),
        toolScaleBar: () => store.setTool("scaleBar"),
        toolPlane: () => store.setTool("plane"),
        escape: () => (tracking.busy ? tracking.cancel() : st.seeding ? store.stopSeeding() : store.setTool("mark")),
        undo: () => store.undo(),
        redo: () => store.redo(),
        help: () => setHelp((h) => !h),
      };
      actions[c]?.();
    };
    const onKey = (e: KeyboardEvent) => {
      if (isTypingTarget(e.target as HTMLElement)) return;
      if (document.querySelector("dialog[open]")) return;
      const c = commandFor(e, store.getState().readOnly);
      if (!c) return;
      if (help && c !== "help" && c !== "escape") return;
      e.preventDefault();
      if (help && c === "escape") return setHelp(false);
      run(c);
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [store, playback, help, tracking]);

  return (
    <div className="relative left-1/2 -mt-4 w-[min(calc(100vw-1.5rem),1920px)] -translate-x-1/2">
      <header className="mb-2 flex flex-wrap items-center gap-x-4 gap-y-2">
        <div className="min-w-0 flex-1">
          <nav aria-label="Breadcrumb" className="text-xs text-ink-muted">
            <Link to="/clips" className="hover:underline">
              Clips
            </Link>
            <span className="mx-1.5">/</span>
            <Link to={`/clips/${shot.clip.id}/shots`} className="hover:underline">
              {shot.clip.title || "Clip"}
            </Link>
          </nav>
          <h1 className="truncate text-lg font-semibold text-ink">
            Digitise · {shot.label || `Shot, frames ${shot.frameStart}–${shot.frameEnd}`}
            <span className="ml-3 text-sm font-normal text-ink-muted">
              {shot.playerName ?? "No player"} · {shot.clip.captureFps.toLocaleString()} fps
              {shot.stick && ` · ${shot.stick.label}${shot.stick.flex ? ` (${shot.stick.flexSource === "measured" ? "measured" : "rated"} ${Math.round(shot.stick.flex)} flex)` : ""}`}
            </span>
          </h1>
        </div>
        <SaveIndicator marks={saving.status} cal={saving.calStatus} />
        <Button variant="secondary" size="sm" onClick={() => setHelp(true)} aria-keyshortcuts="?">
          Keys <kbd className="rounded border border-line-strong px-1 font-mono text-[11px]">?</kbd>
        </Button>
      </header>

      {saving.status?.kind === "conflict" && (
        <div role="alert" className="mb-2 flex flex-wrap items-center gap-3 rounded-lg border border-danger/30 bg-danger-soft px-4 py-2.5 text-sm text-danger-strong" data-testid="conflict-banner">
          <p className="flex-1">
            <b>{saving.status.conflict.savedBy ?? "Someone"}</b> saved this shot at {formatDateTime(saving.status.conflict.savedAt)} (version {saving.status.conflict.currentVersion}) while you were
            editing{overlapText(saving.status.overlaps)}. Everything else of both is kept; your edits are here and not saved yet.
          </p>
          <Button size="sm" variant="danger" onClick={() => void saving.keepMine()}>
            Keep mine{saving.status.overlaps.length ? ` — replaces their ${partsText(saving.status.overlaps)}` : " — save over theirs"}
          </Button>
          <Button size="sm" variant="secondary" onClick={() => void saving.takeTheirs()}>
            Use theirs{saving.status.overlaps.length ? ` — drops your ${partsText(saving.status.overlaps)} edits` : " — drop mine"}
          </Button>
        </div>
      )}
      {saving.status?.kind === "error" && (
        <div role="alert" className="mb-2 rounded-lg border border-danger/30 bg-danger-soft px-4 py-2 text-sm text-danger-strong">
          Not saved: {saving.status.message}
        </div>
      )}
      {!calibrated && (
        <div role="status" className="mb-2 flex items-center gap-2 rounded-lg border border-warn/30 bg-warn-soft px-4 py-2 text-sm text-warn" data-testid="calibration-warning">
          <span aria-hidden className="text-base">⚠</span>
          <span>
            <b>No calibration for this clip</b> — results are in pixels only.{" "}
            {shot.canEdit && "Draw a scale bar (S; a puck's diameter works) or a plane layout (L)."}
          </span>
        </div>
      )}

      {/* From 1024 px wide the panels sit beside the picture; narrower, below it, so they never cover it. */}
      <div className="flex flex-col overflow-hidden rounded-[var(--radius-card)] border border-line bg-surface shadow-[var(--shadow-card)] lg:grid lg:h-[max(34rem,calc(100dvh-13rem))] lg:grid-cols-[minmax(0,1fr)_21rem]">
        <div className="flex min-h-0 min-w-0 flex-col bg-[#101517]">
          <div className="relative h-[max(16rem,75vw)] max-h-[70dvh] min-h-0 lg:h-auto lg:max-h-none lg:flex-1">
            {frames && (
              <FrameViewer
                store={store}
                cache={frames}
                extraOverlay={
                  <>
                    <ProposalsOverlay store={store} proposals={trackingRun.data?.run?.proposals ?? null} />
                    <TrackingOverlay store={store} tracking={tracking} />
                  </>
                }
              />
            )}
            {/* Laid over the picture's foot, so the picture keeps its size (and place) when the bar comes and goes. */}
            <div className="absolute inset-x-0 bottom-0 z-10">
              <TrackingBar store={store} tracking={tracking} />
            </div>
          </div>
          <Transport store={store} playback={playback} jumpRequest={jumpRequest} />
          <FrameStrip store={store} thumbUrl={url} irregular={irregular} />
        </div>
        <aside className="min-h-0 border-t border-line lg:overflow-y-auto lg:border-t-0 lg:border-l" aria-label="Digitise panels">
          <AutoDigitisePanel store={store} teamId={teamId} shotId={shot.id} canEdit={shot.canEdit} />
          <LandmarkPanel store={store} tracking={<TrackingButton tracking={tracking} />} />
          <EventsPanel store={store} />
          <CalibrationPanel store={store} status={saving.calStatus.kind === "saving" ? "saving…" : saving.calStatus.kind === "offline" ? "offline" : null} />
          <PreviewPanel preview={preview} stored={saving.stored} version={saving.version} />
        </aside>
      </div>
      {help && <HelpOverlay onClose={() => setHelp(false)} readOnly={!shot.canEdit} />}
    </div>
  );
}
