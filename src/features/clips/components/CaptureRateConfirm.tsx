import { useState } from "react";
import { Button, Input, toast } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import { PLAYBACK_RATE_MAX_FPS } from "@shared/schemas/clips";
import { useUpdateClip } from "../api/updateClip";
import { formatFps } from "../format";

interface Props {
  teamId: string;
  clip: { id: string; captureFps: number; storedFps: number | null };
  compact?: boolean;
}

/** Asks for the capture rate when the file's stored rate looks like a playback rate. */
export function CaptureRateConfirm({ teamId, clip, compact = false }: Props) {
  const update = useUpdateClip(teamId, clip.id);
  const guess = clip.storedFps !== null && clip.captureFps === clip.storedFps ? "" : String(clip.captureFps);
  const [value, setValue] = useState(guess);
  const [error, setError] = useState<string | null>(null);
  const inputId = `capture-${clip.id}`;

  const confirm = () => {
    const fps = Number(value.replace(/[\s,]/g, ""));
    if (!value.trim() || !Number.isFinite(fps) || fps <= 0) {
      setError("Enter the capture rate in frames per second, e.g. 3200.");
      return;
    }
    setError(null);
    update.mutate(
      { captureFps: fps, captureFpsConfirmed: true },
      {
        onSuccess: () => toast.success(`Capture rate set to ${formatFps(fps)}.`, "Capture rate confirmed"),
        onError: (e) => setError(isApiError(e) && e.errors[0] ? e.errors[0].message : errorMessage(e)),
      },
    );
  };

  return (
    <div className="rounded-lg border border-gold/60 bg-gold-soft px-4 py-3 text-sm">
      <p className="font-semibold text-ink">Confirm the capture rate</p>
      {!compact && (
        <p className="mt-0.5 text-ink-muted">
          The file is stored at {formatFps(clip.storedFps)}. Rates of {PLAYBACK_RATE_MAX_FPS} fps or less are usually a playback rate, not what the camera
          captured. Speeds are worked out from the capture rate, so enter it from the camera's settings.
        </p>
      )}
      <form
        className="mt-2 flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          confirm();
        }}
      >
        <label htmlFor={inputId} className="sr-only">Capture rate (fps)</label>
        <div className="flex items-center gap-1.5">
          <Input id={inputId} inputMode="decimal" className="h-9 w-32" placeholder="e.g. 3200" value={value} onChange={(e) => setValue(e.target.value)} aria-invalid={error ? true : undefined} />
          <span className="text-ink-muted">fps</span>
        </div>
        <Button type="submit" size="sm" loading={update.isPending}>Confirm capture rate</Button>
        {clip.storedFps !== null && (
          <Button type="button" size="sm" variant="ghost" onClick={() => setValue(String(clip.storedFps))}>
            It really is {formatFps(clip.storedFps)}
          </Button>
        )}
      </form>
      {error && <p className="mt-1.5 text-danger" role="alert">{error}</p>}
    </div>
  );
}
