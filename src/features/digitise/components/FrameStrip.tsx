import { memo, useEffect, useRef, useState } from "react";
import { describeIrregularity, type TimingIrregularity } from "@shared/mechanics/time-base";
import { EVENTS, eventLabels, LANDMARKS, landmarkLabels } from "@shared/schemas/shots";
import type { DigitiseStore } from "../model/store";
import { eventColour, eventLetter, landmarkColour } from "../model/style";
import { useDigitise } from "./useDigitise";

const THUMB_W = 112;
const COVERAGE_ROW = 3;

/**
 * The shot's frames at a glance, for coarse scrubbing: thumbnails, which frames each landmark is
 * marked on, the events as flags, gaps and repeats in the clip's frame clock, and the playhead.
 * Press and drag anywhere to scrub.
 */
export function FrameStrip({ store, thumbUrl, irregular = [] }: { store: DigitiseStore; thumbUrl: (frame: number) => string; irregular?: TimingIrregularity[] }) {
  const s = useDigitise(store, (st) => ({ frame: st.frame, start: st.frameStart, end: st.frameEnd, marks: st.doc.marks, events: st.doc.events, visible: st.visible }));
  const box = useRef<HTMLDivElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);
  const [width, setWidth] = useState(0);
  const span = Math.max(1, s.end - s.start + 1);
  const xOf = (f: number) => ((f - s.start + 0.5) / span) * width;

  useEffect(() => {
    const el = box.current!;
    const ro = new ResizeObserver(() => setWidth(el.clientWidth));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  // Coverage: one thin row per landmark, a tick on every marked frame.
  useEffect(() => {
    const c = canvas.current;
    if (!c || width === 0) return;
    const dpr = window.devicePixelRatio || 1;
    const h = LANDMARKS.length * COVERAGE_ROW + 2;
    c.width = Math.round(width * dpr);
    c.height = Math.round(h * dpr);
    const g = c.getContext("2d")!;
    g.setTransform(dpr, 0, 0, dpr, 0, 0);
    g.clearRect(0, 0, width, h);
    const w = Math.max(1, width / span);
    LANDMARKS.forEach((l, row) => {
      g.fillStyle = landmarkColour[l];
      g.globalAlpha = s.visible[l] ? 0.95 : 0.3;
      for (const [f] of s.marks[l] ?? []) g.fillRect(((f - s.start) / span) * width, 1 + row * COVERAGE_ROW, w, COVERAGE_ROW - 1);
    });
  }, [s.marks, s.visible, width, span, s.start]);

  const scrub = (clientX: number) => {
    const r = box.current!.getBoundingClientRect();
    store.goto(s.start + Math.floor(((clientX - r.left) / r.width) * span));
  };


  return (
    <div className="border-t border-[#263034] bg-[#12181a] px-3 pt-5 pb-2">
      <div
        ref={box}
        data-testid="frame-strip"
        className="relative cursor-ew-resize touch-none select-none"
        onPointerDown={(e) => {
          e.currentTarget.setPointerCapture(e.pointerId);
          scrub(e.clientX);
        }}
        onPointerMove={(e) => e.currentTarget.hasPointerCapture(e.pointerId) && scrub(e.clientX)}
        role="slider"
        aria-label="Frames of this shot"
        aria-valuemin={s.start}
        aria-valuemax={s.end}
        aria-valuenow={s.frame}
      >
        <Thumbnails width={width} start={s.start} end={s.end} thumbUrl={thumbUrl} />
        <canvas ref={canvas} className="mt-1 block w-full" style={{ height: LANDMARKS.length * COVERAGE_ROW + 2 }} aria-hidden title={LANDMARKS.map((l) => landmarkLabels[l]).join(" · ")} />
        {EVENTS.map((k) => {
          const f = s.events[k];
          if (f === undefined || width === 0) return null;
          return (
            <div key={k} className="pointer-events-none absolute -top-4 bottom-0" style={{ left: xOf(f) }} title={`${eventLabels[k]}: frame ${f}`}>
              <div className="absolute top-4 bottom-0 w-px -translate-x-1/2" style={{ background: eventColour[k] }} />
              <div className="absolute top-0 -translate-x-1/2 rounded-sm px-1 text-[10px] leading-4 font-bold text-[#101517]" style={{ background: eventColour[k] }}>
                {eventLetter[k]}
              </div>
            </div>
          );
        })}
        {width > 0 &&
          irregular
            .filter((g) => g.from >= s.start && g.from < s.end)
            .map((g) => (
              // Between the two frames of the step: an amber seam with a tag, "gap" or "rep" (repeat).
              <div
                key={`${g.kind}-${g.from}`}
                data-testid="strip-timing-mark"
                className="absolute -top-4 bottom-0"
                style={{ left: xOf(g.from + 0.5) }}
                title={describeIrregularity(g)}
                aria-label={describeIrregularity(g)}
              >
                <div className="absolute top-4 h-11 w-1 -translate-x-1/2 bg-[#f2b33d] shadow-[0_0_0_1px_rgba(0,0,0,0.75)]" />
                <div className="absolute top-0 -translate-x-1/2 rounded-sm border border-[#f2b33d] bg-[#12181a] px-1 text-[10px] leading-[14px] font-bold text-[#f2b33d]">
                  {g.kind === "gap" ? "gap" : "rep"}
                </div>
              </div>
            ))}
        {width > 0 && (
          <div
            className="pointer-events-none absolute -top-1 -bottom-1 left-0 w-0.5 bg-white shadow-[0_0_0_1px_rgba(0,0,0,0.6)] will-change-transform"
            style={{ transform: `translateX(${xOf(s.frame) - 1}px)` }}
            data-testid="strip-playhead"
          />
        )}
      </div>
      <div className="mt-1 flex justify-between font-mono text-[11px] text-[#7d8a88] tabular-nums">
        <span>{s.start}</span>
        <span>{s.end}</span>
      </div>
    </div>
  );
}

/** Evenly spaced frames of the shot; unchanged while stepping, so it is not redrawn then. */
const Thumbnails = memo(function Thumbnails({ width, start, end, thumbUrl }: { width: number; start: number; end: number; thumbUrl: (frame: number) => string }) {
  const span = Math.max(1, end - start + 1);
  const n = Math.max(1, Math.floor(width / THUMB_W));
  const frames = Array.from({ length: n }, (_, i) => Math.min(end, start + Math.round(((i + 0.5) / n) * span - 0.5)));
  return (
    <div className="flex h-11 overflow-hidden rounded-sm bg-[#1b2326]">
      {frames.map((f, i) => (
        <img key={`${i}-${f}`} src={thumbUrl(f)} alt="" loading="lazy" draggable={false} className="h-full min-w-0 flex-1 object-cover opacity-80" />
      ))}
    </div>
  );
});
