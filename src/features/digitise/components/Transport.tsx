import { useEffect, useRef, useState } from "react";
import { cn } from "@/lib/cn";
import type { DigitiseStore } from "../model/store";
import { fractionLabel, shownText } from "@/components/shot/playback/speed";
import type { Playback } from "./usePlayback";
import { useDigitise } from "./useDigitise";

/** Step, play and jump: every button names its key. */
export function Transport({ store, playback, jumpRequest }: { store: DigitiseStore; playback: Playback; jumpRequest: number }) {
  const s = useDigitise(store, (st) => ({ frame: st.frame, start: st.frameStart, end: st.frameEnd, fps: st.captureFps }));
  const [jump, setJump] = useState("");
  const jumpInput = useRef<HTMLInputElement>(null);
  useEffect(() => {
    if (jumpRequest > 0) {
      jumpInput.current?.focus();
      jumpInput.current?.select();
    }
  }, [jumpRequest]);

  const go = () => {
    const n = Number(jump);
    if (!Number.isInteger(n)) store.notify("Type a whole frame number.", "info");
    else if (n < s.start || n > s.end) store.notify(`Frame ${n} is outside this shot (frames ${s.start}–${s.end}).`);
    else store.goto(n);
    setJump("");
    jumpInput.current?.blur();
  };

  return (
    <div className="flex flex-wrap items-center gap-x-3 gap-y-2 border-t border-[#263034] bg-[#161d20] px-3 py-2 text-[13px] text-[#dfe6e3]">
      <div className="flex items-center gap-0.5" role="group" aria-label="Step through frames">
        <TButton label="First frame (Home)" onClick={() => store.goto(s.start)}>⇤</TButton>
        <TButton label="−10, back 10 frames (Shift + ←)" onClick={() => store.stepBy(-10)}>−10</TButton>
        <TButton label="−1, previous frame (←)" onClick={() => store.stepBy(-1)}>−1</TButton>
        <TButton label="Play backward (Shift + Space)" pressed={playback.dir === -1} onClick={() => playback.toggle(-1)}>
          {playback.dir === -1 ? "❚❚" : "◀"}
        </TButton>
        <TButton label="Play forward (Space)" pressed={playback.dir === 1} onClick={() => playback.toggle(1)}>
          {playback.dir === 1 ? "❚❚" : "▶"}
        </TButton>
        <TButton label="+1, next frame (→)" onClick={() => store.stepBy(1)}>+1</TButton>
        <TButton label="+10, forward 10 frames (Shift + →)" onClick={() => store.stepBy(10)}>+10</TButton>
        <TButton label="Last frame (End)" onClick={() => store.goto(s.end)}>⇥</TButton>
      </div>
      <label className="flex items-center gap-1.5 text-[#9aa6a4]">
        Speed
        <select
          aria-label="Playback speed"
          value={playback.fraction}
          onChange={(e) => playback.setFraction(Number(e.target.value))}
          className="h-7 rounded border border-[#33403f] bg-[#0f1416] px-1.5 text-[#dfe6e3]"
        >
          {playback.choices.map((f) => (
            <option key={f} value={f}>
              {fractionLabel(f)}
            </option>
          ))}
        </select>
        <span className="tabular-nums" title="Frames shown per second of your time">
          {shownText(s.fps, playback.fraction)}
        </span>
      </label>
      <form
        className="ml-auto flex items-center gap-1.5"
        onSubmit={(e) => {
          e.preventDefault();
          go();
        }}
      >
        <label htmlFor="jump-frame" className="text-[#9aa6a4]">
          Go to frame <kbd className="rounded border border-[#33403f] px-1 text-[11px]">G</kbd>
        </label>
        <input
          id="jump-frame"
          ref={jumpInput}
          inputMode="numeric"
          value={jump}
          placeholder={String(s.frame)}
          onChange={(e) => setJump(e.target.value.replace(/[^\d]/g, ""))}
          onKeyDown={(e) => e.key === "Escape" && jumpInput.current?.blur()}
          className="h-7 w-20 rounded border border-[#33403f] bg-[#0f1416] px-2 font-mono tabular-nums text-[#f5f7f5] placeholder:text-[#5f6b69]"
        />
      </form>
    </div>
  );
}

function TButton({ label, onClick, pressed, children }: { label: string; onClick: () => void; pressed?: boolean; children: React.ReactNode }) {
  return (
    <button
      type="button"
      title={label}
      aria-label={label}
      aria-pressed={pressed}
      onClick={onClick}
      className={cn(
        "h-7 min-w-8 rounded px-2 font-mono text-[12px] font-medium hover:bg-white/10 focus-visible:outline-[#f3c969]",
        pressed && "bg-[#f3c969] text-[#101517] hover:bg-[#f3c969]",
      )}
    >
      {children}
    </button>
  );
}
