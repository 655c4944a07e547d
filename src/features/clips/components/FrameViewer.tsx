import { useEffect, useMemo, useRef, useState, type KeyboardEvent } from "react";
import { Button, Input } from "@/components/ui";
import { capacityFor, FrameCache } from "@/components/shot/stepping/frame-cache";
import { frameCommandFor, runFrameCommand } from "@/components/shot/stepping/frame-keys";
import { createFrameLoader } from "@/components/shot/stepping/frame-loader";
import { useStepper, type FrameStepper } from "@/components/shot/stepping/frame-stepper";
import { PlaybackControls } from "@/components/shot/playback/PlaybackControls";
import { frameTarget, usePlayback } from "@/components/shot/playback/usePlayback";
import { frameClock } from "@shared/frame-clock";
import { captureTimes, type ClipDetail } from "@shared/schemas/clips";
import { formatCount } from "../format";

interface Props {
  clip: ClipDetail;
  stepper: FrameStepper;
  /** Frames that exist so far (all once ready; fewer while extracting). */
  available: number;
}

const ms = new Intl.NumberFormat(undefined, { minimumFractionDigits: 2, maximumFractionDigits: 2 });

/**
 * One frame at a time, stepped with the buttons, the slider or the arrow keys (Shift: ten frames),
 * through the same stepper, key table and decoded-frame cache as the Digitise page: the picture
 * is drawn from memory, and the frame on screen is always the last one asked for.
 */
export function FrameViewer({ clip, stepper, available }: Props) {
  const { frame, last } = useStepper(stepper);
  const canvas = useRef<HTMLCanvasElement>(null);
  const [drawn, setDrawn] = useState<{ frame: number; width: number } | null>(null);
  // The clip's own frame clock in capture time (decision 135); playback moves in that time.
  const clock = useMemo(
    () => frameClock(clip.frameTimes ? { firstFrame: 1, seconds: captureTimes(clip.frameTimes, clip.storedFps, clip.captureFps) } : null, clip.captureFps),
    [clip.frameTimes, clip.storedFps, clip.captureFps],
  );
  const t = clock.t(frame) - clock.t(1);
  const target = useMemo(() => frameTarget(clock, stepper.getState, (f) => stepper.goto(f)), [clock, stepper]);
  const playback = usePlayback(target, clip.captureFps);
  const width = clip.width ?? 1280;
  const height = clip.height ?? 720;

  // While frames are still being extracted the cache only asks for those that exist.
  const cacheLast = clip.status === "ready" ? clip.frameCount ?? available : available;
  const [cache, setCache] = useState<FrameCache<ImageBitmap> | null>(null);
  useEffect(() => {
    if (cacheLast < 1) return;
    const loader = createFrameLoader();
    const c = new FrameCache<ImageBitmap>({
      load: (f, signal) => loader.load(`${clip.frameUrlBase}/${f}`, signal), first: 1, last: cacheLast, capacity: capacityFor(width, height), ahead: 24, behind: 8,
    });
    setCache(c);
    return () => {
      c.dispose();
      loader.dispose();
    };
  }, [clip.frameUrlBase, cacheLast, width, height]);

  // Draw the wanted frame as soon as it is decoded; the previous one stays up (dimmed) meanwhile.
  useEffect(() => {
    if (!cache || available < 1) return;
    const paint = (f: number, img: ImageBitmap) => {
      if (stepper.getState().frame !== f) return;
      const ctx = canvas.current?.getContext("2d");
      if (!ctx) return;
      ctx.drawImage(img, 0, 0, width, height);
      setDrawn({ frame: f, width: img.width });
    };
    const now = cache.get(frame);
    const wanted = cache.focus(frame); // also prefetches the frames around it
    if (now) paint(frame, now);
    else void wanted.then((img) => paint(frame, img), () => {});
  }, [cache, frame, available, stepper, width, height]);

  const onKey = (e: KeyboardEvent) => {
    const c = frameCommandFor(e);
    if (!c) return;
    e.preventDefault();
    runFrameCommand(c, stepper, stepper.getState());
  };
  const title = clip.title || clip.originalName;
  const stale = drawn?.frame !== frame;

  return (
    <div className="flex flex-col gap-3">
      <div
        id="frame-viewer"
        tabIndex={0}
        onKeyDown={onKey}
        role="group"
        aria-label="Frame viewer: arrow keys step one frame, Shift and an arrow ten, Home and End the ends"
        className="relative overflow-hidden rounded-lg bg-ink/90 ring-1 ring-line focus-visible:ring-2 focus-visible:ring-accent"
        style={{ aspectRatio: `${width} / ${height}` }}
      >
        {available > 0 ? (
          <canvas
            ref={canvas}
            width={width}
            height={height}
            role="img"
            aria-label={`Frame ${frame} of ${title}`}
            data-testid="frame-image"
            data-frame={drawn?.frame ?? ""}
            data-width={drawn?.width ?? ""}
            className="block size-full transition-opacity"
            style={{ opacity: stale && drawn ? 0.6 : 1 }}
          />
        ) : (
          <div className="flex size-full items-center justify-center text-sm text-white/80">The first frames appear here as soon as they are extracted.</div>
        )}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <div className="flex items-center gap-1" role="group" aria-label="Step through frames">
          <Button variant="secondary" size="sm" onClick={() => stepper.goto(1)} disabled={frame <= 1} aria-label="First frame"><Icon d="M4 3v10M13 3 6 8l7 5z" /></Button>
          <Button variant="secondary" size="sm" onClick={() => stepper.stepBy(-10)} disabled={frame <= 1} aria-label="−10, back ten frames">−10</Button>
          <Button variant="secondary" size="sm" onClick={() => stepper.stepBy(-1)} disabled={frame <= 1} aria-label="Previous frame"><Icon d="M11 3 4 8l7 5z" /></Button>
        </div>
        <FrameBox frame={frame} last={last} total={clip.frameCount} onGo={(n) => stepper.goto(n)} />
        <div className="flex items-center gap-1" role="group" aria-label="Step forward">
          <Button variant="secondary" size="sm" onClick={() => stepper.stepBy(1)} disabled={frame >= last} aria-label="Next frame"><Icon d="M5 3l7 5-7 5z" /></Button>
          <Button variant="secondary" size="sm" onClick={() => stepper.stepBy(10)} disabled={frame >= last} aria-label="+10, forward ten frames">+10</Button>
          <Button variant="secondary" size="sm" onClick={() => stepper.goto(last)} disabled={frame >= last} aria-label="Last frame"><Icon d="M12 3v10M3 3l7 5-7 5z" /></Button>
        </div>
        <PlaybackControls playback={playback} captureFps={clip.captureFps} what="the clip" />
        <span className="ml-auto text-sm text-ink-muted tabular-nums" title="Real time since frame 1, on the clip's own frame clock" data-testid="clip-time">
          t = {ms.format(t * 1000)} ms
        </span>
      </div>
      <input type="range" min={1} max={last} value={frame} onChange={(e) => stepper.goto(Number(e.target.value))} aria-label="Scrub through frames" className="w-full accent-[var(--color-accent)]" />
      {available < (clip.frameCount ?? 0) && (
        <p className="text-xs text-ink-muted">{formatCount(available)} of {formatCount(clip.frameCount)} frames extracted so far; the rest follow.</p>
      )}
    </div>
  );
}

/**
 * The frame number box: typing only edits the box (it may be emptied while typing); Enter or
 * leaving it goes there. A number outside the clip goes to the nearest end.
 */
function FrameBox({ frame, last, total, onGo }: { frame: number; last: number; total: number | null; onGo: (n: number) => void }) {
  const [draft, setDraft] = useState<string | null>(null);
  const commit = () => {
    if (draft !== null && /^\d+$/.test(draft)) onGo(Number(draft));
    setDraft(null);
  };
  return (
    <label className="flex items-center gap-1.5 text-sm whitespace-nowrap text-ink-muted">
      Frame
      <span className="w-20">
        <Input
          className="h-8 text-center tabular-nums"
          inputMode="numeric"
          aria-label="Frame number"
          value={draft ?? String(frame)}
          onFocus={(e) => e.currentTarget.select()}
          onChange={(e) => setDraft(e.target.value.replace(/[^\d]/g, ""))}
          onBlur={commit}
          onKeyDown={(e) => {
            if (e.key === "Enter") commit();
            else if (e.key === "Escape") setDraft(null);
          }}
          title={`1 to ${last}`}
        />
      </span>
      of {formatCount(total)}
    </label>
  );
}

/** The preview strip at its own size, scrolling sideways inside its box; a click opens the frame under the pointer. */
export function FrameStrip({ clip, onFrame }: { clip: ClipDetail; onFrame: (n: number) => void }) {
  if (!clip.stripUrl || !clip.frameCount) return null;
  // Mirrors the strip's layout: up to 20 tiles, every k-th frame from frame 1.
  const tiles = Math.max(1, Math.min(20, clip.frameCount));
  const every = Math.max(1, Math.floor(clip.frameCount / tiles));
  return (
    <div className="max-w-full min-w-0 overflow-x-auto rounded-md ring-1 ring-line">
      <button
        type="button"
        className="block w-max hover:opacity-90"
        aria-label="Preview strip: click a picture to open that frame"
        onClick={(e) => {
          const box = e.currentTarget.getBoundingClientRect();
          const tile = Math.min(tiles - 1, Math.max(0, Math.floor(((e.clientX - box.left) / box.width) * tiles)));
          onFrame(tile * every + 1);
        }}
      >
        <img src={clip.stripUrl} alt="" className="block h-[72px] max-w-none" />
      </button>
    </div>
  );
}

const Icon = ({ d }: { d: string }) => (
  <svg aria-hidden viewBox="0 0 16 16" className="size-3.5" fill="currentColor" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round">
    <path d={d} />
  </svg>
);
