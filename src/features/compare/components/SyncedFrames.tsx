import { useEffect, useMemo, useRef, type KeyboardEvent } from "react";
import { PlaybackControls } from "@/components/shot/playback/PlaybackControls";
import { usePlayback, type PlaybackTarget } from "@/components/shot/playback/usePlayback";
import { Button, Card } from "@/components/ui";
import { FrameImage } from "@/components/shot/FrameImage";
import { frameUrl } from "@/components/shot/frames";
import { eventLabels } from "@shared/schemas/shots";
import type { ShotReadout } from "@shared/schemas/readout";
import { frameAtStep, stepNearest, stepTimeMs, type ClipClock, type SyncPlan } from "../lib/sync";
import type { Side } from "../lib/differences";

interface Props {
  teamId: string;
  shots: Record<Side, ShotReadout>;
  clocks: Record<Side, ClipClock>;
  plan: SyncPlan;
  names: Record<Side, string>;
  colors: Record<Side, string>;
  step: number;
  onStep: (k: number) => void;
}

const signedMs = (v: number) => `${v > 0 ? "+" : v < 0 ? "−" : ""}${Math.abs(v).toFixed(2)} ms`;

/** Both clips at the same moment from puck strike, stepping together by a common time step. */
export function SyncedFrames({ teamId, shots, clocks, plan, names, colors, step, onStep }: Props) {
  const t = stepTimeMs(plan, step);
  const go = (k: number) => onStep(Math.min(plan.kMax, Math.max(plan.kMin, k)));

  // Both clips play together in time: the common time advances and each shows its frame at that
  // moment. About 30 steps a second by default (a step is a frame of the faster clip).
  const at = useRef({ step, onStep });
  at.current = { step, onStep };
  const target = useMemo((): PlaybackTarget => {
    let shown: number | null = null;
    return {
      now: () => {
        shown = at.current.step;
        return stepTimeMs(plan, shown) / 1000;
      },
      seek: (tS) => {
        if (shown !== null && at.current.step !== shown) return false;
        shown = stepNearest(plan, tS * 1000);
        // Ahead of React's render, so the next tick does not take the old step for the person's own.
        at.current.step = shown;
        at.current.onStep(shown);
        return tS * 1000 >= stepTimeMs(plan, plan.kMin) && tS * 1000 <= stepTimeMs(plan, plan.kMax);
      },
    };
  }, [plan]);
  const playback = usePlayback(target, plan.fastFps);

  // Fetch the next few frames ahead of time, so stepping does not wait on the network.
  useEffect(() => {
    for (const side of ["a", "b"] as const)
      for (const d of [-2, -1, 1, 2, 3, 4]) {
        const f = frameAtStep(clocks[side], plan, Math.min(plan.kMax, Math.max(plan.kMin, step + d))).frame;
        new Image().src = frameUrl(teamId, shots[side].clip.id, f);
      }
  }, [step, clocks, plan, shots, teamId]);

  const onKey = (e: KeyboardEvent) => {
    const n = e.shiftKey ? 10 : 1;
    if (e.key === "ArrowRight") go(step + n);
    else if (e.key === "ArrowLeft") go(step - n);
    else if (e.key === "Home") go(plan.kMin);
    else if (e.key === "End") go(plan.kMax);
    else return;
    e.preventDefault();
  };

  const jumps = (["a", "b"] as const).flatMap((side) =>
    shots[side].events.filter((e) => e.tFromStrikeMs !== null && e.key !== "puckStrike").map((e) => ({ side, key: e.key, t: e.tFromStrikeMs! })),
  );

  return (
    <Card
      title="Both clips, synced at puck strike"
      description={`One step = ${plan.stepMs.toFixed(3)} ms, one frame at ${plan.fastFps.toLocaleString()} fps; each clip shows its nearest frame at that moment.`}
    >
      <div tabIndex={0} onKeyDown={onKey} className="rounded-lg outline-offset-4 focus-visible:outline-2 focus-visible:outline-accent" aria-label="Synced frames: arrow keys step, Shift steps ten" data-testid="synced" data-step={step} data-t-ms={t}>
        <div className="grid gap-4 md:grid-cols-2">
          {(["a", "b"] as const).map((side) => {
            const c = clocks[side];
            const f = frameAtStep(c, plan, step);
            const r = shots[side];
            return (
              <figure key={side} data-testid={`sync-${side}`} data-frame={f.frame} data-frame-t-ms={f.tMs} data-fps={c.fps} className="min-w-0">
                <div className="relative">
                  <FrameImage teamId={teamId} clipId={r.clip.id} frame={f.frame} alt={`${names[side]}, frame ${f.frame}`} aspect={r.clip.width && r.clip.height ? r.clip.width / r.clip.height : 16 / 9} eager className="ring-[3px]" style={{ ["--tw-ring-color" as string]: colors[side] }} />
                  <span className="absolute top-2 right-2 rounded-md px-2 py-0.5 text-sm font-semibold text-white" style={{ background: colors[side] }}>
                    {names[side]}
                  </span>
                  {f.outside && (
                    <span className="absolute inset-x-0 bottom-0 bg-ink/70 px-3 py-1.5 text-center text-sm text-white">
                      {f.outside === "before" ? "Before this shot's first frame" : "After this shot's last frame"}
                    </span>
                  )}
                </div>
                <figcaption className="mt-2 flex flex-wrap justify-between gap-x-3 text-sm text-ink-muted tabular-nums">
                  <span>
                    Frame <strong className="text-ink">{f.frame}</strong> · {signedMs(f.tMs)}
                  </span>
                  <span>{c.fps.toLocaleString()} fps</span>
                </figcaption>
              </figure>
            );
          })}
        </div>

        <div className="mt-4 flex flex-wrap items-center gap-2">
          <Button variant="secondary" size="sm" onClick={() => go(step - 10)} aria-label="−10, back ten steps">
            ◀◀ 10
          </Button>
          <Button variant="secondary" size="sm" onClick={() => go(step - 1)} aria-label="Back one step" data-testid="step-back">
            ◀ Step
          </Button>
          <Button variant="secondary" size="sm" onClick={() => go(step + 1)} aria-label="Forward one step" data-testid="step-forward">
            Step ▶
          </Button>
          <Button variant="secondary" size="sm" onClick={() => go(step + 10)} aria-label="+10, forward ten steps">
            10 ▶▶
          </Button>
          <PlaybackControls playback={playback} captureFps={plan.fastFps} what="both clips" />
          <span className="ml-2 min-w-40 text-sm font-semibold text-ink tabular-nums" aria-live={playback.dir ? "off" : "polite"}>
            {signedMs(t)} from puck strike
          </span>
          <input
            type="range"
            min={plan.kMin}
            max={plan.kMax}
            value={step}
            onChange={(e) => go(Number(e.target.value))}
            aria-label="Time from puck strike"
            className="min-w-48 flex-1 accent-accent"
          />
        </div>
        <div className="mt-3 flex flex-wrap items-center gap-2 text-sm">
          <span className="text-ink-muted">Jump to:</span>
          <Button variant="ghost" size="sm" onClick={() => go(0)}>
            Puck strike
          </Button>
          {jumps.map((j) => (
            <Button key={`${j.side}-${j.key}`} variant="ghost" size="sm" onClick={() => go(stepNearest(plan, j.t))}>
              <span aria-hidden className="size-2.5 rounded-full" style={{ background: colors[j.side] }} />
              {eventLabels[j.key]} {names[j.side].replace("Shot ", "")}
            </Button>
          ))}
        </div>
      </div>
    </Card>
  );
}
