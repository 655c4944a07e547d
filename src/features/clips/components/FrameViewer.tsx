import { useEffect, useMemo, type KeyboardEvent } from "react";
import { Button, Input } from "@/components/ui";
import { captureTimes, type ClipDetail } from "@shared/schemas/clips";
import { formatCount } from "../format";

interface Props {
  clip: ClipDetail;
  frame: number;
  onFrame: (n: number) => void;
  /** Frames that exist so far (all once ready; fewer while extracting). */
  available: number;
}

const ms = new Intl.NumberFormat(undefined, { minimumFractionDigits: 2, maximumFractionDigits: 2 });

/** One frame at a time, stepped with the buttons, the slider or the arrow keys (Shift: ten frames). */
export function FrameViewer({ clip, frame, onFrame, available }: Props) {
  const last = Math.max(1, available);
  const go = (n: number) => onFrame(Math.min(last, Math.max(1, Math.round(n))));
  const times = useMemo(() => (clip.frameTimes ? captureTimes(clip.frameTimes, clip.storedFps, clip.captureFps) : null), [clip.frameTimes, clip.storedFps, clip.captureFps]);
  const t = times?.[frame - 1] ?? (frame - 1) / clip.captureFps;

  useEffect(() => {
    // The next frame is usually wanted next: fetch it now (frames are cached for a year).
    if (frame < last) new Image().src = `${clip.frameUrlBase}/${frame + 1}`;
  }, [frame, last, clip.frameUrlBase]);

  const onKey = (e: KeyboardEvent) => {
    const step = e.shiftKey ? 10 : 1;
    if (e.key === "ArrowRight") go(frame + step);
    else if (e.key === "ArrowLeft") go(frame - step);
    else if (e.key === "Home") go(1);
    else if (e.key === "End") go(last);
    else return;
    e.preventDefault();
  };

  return (
    <div className="flex flex-col gap-3" tabIndex={0} onKeyDown={onKey} aria-label="Frame viewer: arrow keys step one frame, Shift+arrow ten" id="frame-viewer">
      <div className="overflow-hidden rounded-lg bg-ink/90 ring-1 ring-line" style={{ aspectRatio: clip.width && clip.height ? `${clip.width} / ${clip.height}` : "16 / 9" }}>
        {available > 0 ? (
          <img src={`${clip.frameUrlBase}/${frame}`} alt={`Frame ${frame} of ${clip.title || clip.originalName}`} className="size-full object-contain" data-testid="frame-image" />
        ) : (
          <div className="flex size-full items-center justify-center text-sm text-white/80">The first frames appear here as soon as they are extracted.</div>
        )}
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" size="sm" onClick={() => go(1)} disabled={frame <= 1} aria-label="First frame"><Icon d="M4 3v10M13 3 6 8l7 5z" /></Button>
        <Button variant="secondary" size="sm" onClick={() => go(frame - 10)} disabled={frame <= 1} aria-label="Back ten frames">−10</Button>
        <Button variant="secondary" size="sm" onClick={() => go(frame - 1)} disabled={frame <= 1} aria-label="Previous frame"><Icon d="M11 3 4 8l7 5z" /></Button>
        <label className="flex items-center gap-1.5 text-sm whitespace-nowrap text-ink-muted">
          Frame
          <span className="w-20">
            <Input className="h-8 text-center tabular-nums" inputMode="numeric" value={frame} aria-label="Frame number"
              onChange={(e) => Number(e.target.value) > 0 && go(Number(e.target.value))} />
          </span>
          of {formatCount(clip.frameCount)}
        </label>
        <Button variant="secondary" size="sm" onClick={() => go(frame + 1)} disabled={frame >= last} aria-label="Next frame"><Icon d="M5 3l7 5-7 5z" /></Button>
        <Button variant="secondary" size="sm" onClick={() => go(frame + 10)} disabled={frame >= last} aria-label="Forward ten frames">+10</Button>
        <Button variant="secondary" size="sm" onClick={() => go(last)} disabled={frame >= last} aria-label="Last frame"><Icon d="M12 3v10M3 3l7 5-7 5z" /></Button>
        <span className="ml-auto text-sm text-ink-muted tabular-nums" title="Real time since frame 1, from the capture rate">
          t = {ms.format(t * 1000)} ms
        </span>
      </div>
      <input type="range" min={1} max={last} value={frame} onChange={(e) => go(Number(e.target.value))} aria-label="Scrub through frames" className="w-full accent-[var(--color-accent)]" />
      {available < (clip.frameCount ?? 0) && (
        <p className="text-xs text-ink-muted">{formatCount(available)} of {formatCount(clip.frameCount)} frames extracted so far; the rest follow.</p>
      )}
    </div>
  );
}

/** The preview strip; a click opens the frame under the pointer. */
export function FrameStrip({ clip, onFrame }: { clip: ClipDetail; onFrame: (n: number) => void }) {
  if (!clip.stripUrl || !clip.frameCount) return null;
  // Mirrors the strip's layout: up to 20 tiles, every k-th frame from frame 1.
  const tiles = Math.max(1, Math.min(20, clip.frameCount));
  const every = Math.max(1, Math.floor(clip.frameCount / tiles));
  return (
    <div className="overflow-x-auto rounded-md ring-1 ring-line">
      <button
        type="button"
        className="block w-max hover:opacity-90"
        aria-label="Preview strip: click a picture to open that frame"
        onClick={(e) => {
          const box = e.currentTarget.getBoundingClientRect();
          const tile = Math.min(tiles - 1, Math.floor(((e.clientX - box.left) / box.width) * tiles));
          onFrame(tile * every + 1);
        }}
      >
        <img src={clip.stripUrl} alt="" className="block h-[90px] max-w-none" />
      </button>
    </div>
  );
}

const Icon = ({ d }: { d: string }) => (
  <svg aria-hidden viewBox="0 0 16 16" className="size-3.5" fill="currentColor" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round">
    <path d={d} />
  </svg>
);
