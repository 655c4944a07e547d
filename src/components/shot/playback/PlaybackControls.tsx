import { Button, Select } from "@/components/ui";
import { fractionLabel, shownText } from "./speed";
import type { Playback } from "./usePlayback";

/** Play / pause and the speed as a fraction of real time, with the frames a second that makes. */
export function PlaybackControls({ playback, captureFps, what }: { playback: Playback; captureFps: number; what: string }) {
  const playing = playback.dir === 1;
  return (
    <div className="flex flex-wrap items-center gap-2">
      <Button variant={playing ? "primary" : "secondary"} size="sm" onClick={() => playback.toggle(1)} aria-pressed={playing} aria-label={playing ? `Pause ${what}` : `Play ${what}`} data-testid="play">
        {playing ? "❚❚ Pause" : "▶ Play"}
      </Button>
      <label className="flex items-center gap-1.5 text-sm text-ink-muted">
        Speed
        <Select compact aria-label="Playback speed" value={playback.fraction} onChange={(e) => playback.setFraction(Number(e.target.value))}>
          {playback.choices.map((f) => (
            <option key={f} value={f}>
              {fractionLabel(f)}
            </option>
          ))}
        </Select>
      </label>
      <span className="text-sm text-ink-muted tabular-nums" title="Frames shown per second of your time" data-testid="shown-fps">
        {shownText(captureFps, playback.fraction)}
      </span>
    </div>
  );
}
