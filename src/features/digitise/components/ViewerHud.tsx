import { useEffect, useState } from "react";
import { landmarkLabels } from "@shared/schemas/shots";
import { cn } from "@/lib/cn";
import type { DigitiseStore } from "../model/store";
import { landmarkColour } from "../model/style";
import { formatMs, msSince, msSinceFirst } from "../model/timing";
import { useDigitise } from "./useDigitise";

const toolText = { mark: "Marking", scaleBar: "Scale bar", plane: "Plane layout" } as const;

/** Read-outs and view buttons laid over the canvas (HTML, so text stays crisp at any zoom). */
export function ViewerHud({ store, loading }: { store: DigitiseStore; loading: boolean }) {
  const s = useDigitise(store, (st) => ({
    frame: st.frame, fps: st.captureFps, clock: st.clock, startMs: st.startMs, strike: st.doc.events.puckStrike, zoom: st.view.zoom, tool: st.tool, active: st.activeLandmark,
    readOnly: st.readOnly, autoAdvance: st.autoAdvance, notice: st.notice, frameStart: st.frameStart, frameEnd: st.frameEnd,
  }));
  return (
    <>
      <div data-hud className="pointer-events-none absolute top-3 left-3 flex flex-col gap-1 font-mono text-[12px] leading-tight text-[#e9eee9]">
        <div className="rounded-md bg-black/60 px-2.5 py-1.5">
          <span className="text-[15px] font-semibold tabular-nums" data-testid="hud-frame">
            Frame {s.frame}
          </span>
          <span className="ml-2 text-[#9aa6a4] max-sm:hidden">
            of {s.frameStart}–{s.frameEnd}
          </span>
          <div className="mt-0.5 tabular-nums">
            <span title="Time since the clip's first frame, on the clip's own frame clock" data-testid="hud-time">{formatMs(msSinceFirst(s.frame, s), s.fps)}</span>
            <span className="ml-3 text-[#f3c969] max-sm:ml-0 max-sm:block" title="Time since puck strike">
              {s.strike === undefined ? "puck strike not set" : `${formatMs(msSince(s.frame, s.strike, s.clock), s.fps)} from strike`}
            </span>
          </div>
        </div>
        {loading && <div className="w-fit rounded-md bg-black/60 px-2 py-1 text-[#ffd36b]">loading frame {s.frame}…</div>}
      </div>

      <div data-hud className="absolute top-3 right-3 flex items-center gap-1 rounded-md bg-black/60 p-1 text-[12px] text-[#e9eee9]">
        <HudButton onClick={() => store.zoomBy(1 / 1.25)} label="Zoom out (−)">
          −
        </HudButton>
        <span className="w-14 text-center font-mono tabular-nums" data-testid="hud-zoom">
          {Math.round(s.zoom * 100)}%
        </span>
        <HudButton onClick={() => store.zoomBy(1.25)} label="Zoom in (+)">
          +
        </HudButton>
        <HudButton onClick={() => store.fit()} label="Fit the frame to the view (F)">
          Fit
        </HudButton>
        <HudButton onClick={() => store.originalPixels()} label="1:1, original pixels (O)">
          1:1
        </HudButton>
      </div>

      <div data-hud className="pointer-events-none absolute bottom-3 left-3 flex items-center gap-2 rounded-md bg-black/60 px-2.5 py-1.5 text-[12px] text-[#e9eee9]">
        {s.readOnly ? (
          <span>Read-only: you can step, zoom and pan</span>
        ) : s.tool === "mark" ? (
          <>
            <span className="size-2.5 rounded-full" style={{ background: landmarkColour[s.active] }} />
            <span>
              Click to place <b className="font-semibold">{landmarkLabels[s.active]}</b>
              {s.autoAdvance && <span className="text-[#9aa6a4]"> · then next frame</span>}
            </span>
          </>
        ) : (
          <span>
            {toolText[s.tool]}: {s.tool === "scaleBar" ? "click both ends of a known length; drag an end to adjust" : "click each known point; type its position in the panel"}
          </span>
        )}
      </div>
      <Notice notice={s.notice} />
    </>
  );
}

function HudButton({ onClick, label, children }: { onClick: () => void; label: string; children: React.ReactNode }) {
  return (
    <button type="button" title={label} aria-label={label} onClick={onClick} className="h-6 min-w-6 rounded px-1.5 font-medium hover:bg-white/15 focus-visible:outline-[#f3c969]">
      {children}
    </button>
  );
}

function Notice({ notice }: { notice: { text: string; tone: string; seq: number } | null }) {
  const [visible, setVisible] = useState(false);
  useEffect(() => {
    if (!notice) return;
    setVisible(true);
    const t = setTimeout(() => setVisible(false), 4000);
    return () => clearTimeout(t);
  }, [notice?.seq, notice]);
  if (!notice || !visible) return null;
  return (
    <div
      data-hud
      role="status"
      data-testid="viewer-notice"
      className={cn(
        "pointer-events-none absolute bottom-12 left-1/2 max-w-[80%] -translate-x-1/2 rounded-md px-3 py-1.5 text-center text-[13px] shadow-lg",
        notice.tone === "warn" ? "bg-[#5a2a16]/95 text-[#ffe2d6]" : "bg-black/75 text-[#e9eee9]",
      )}
    >
      {notice.text}
    </div>
  );
}
