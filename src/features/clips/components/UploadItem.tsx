import { useEffect, useRef, useState } from "react";
import { Link } from "react-router-dom";
import { Alert, Badge, Button, Spinner } from "@/components/ui";
import type { ClipOptions, ClipSummary } from "@shared/schemas/clips";
import { useQueryClient } from "@tanstack/react-query";
import { useClip } from "../api/clip";
import { useClipProgress } from "../api/clipProgress";
import { formatBytes, formatCount, formatFps } from "../format";
import { createClipUpload, rememberedMeta, type ClipUpload, type UploadProblem } from "../upload/clipUpload";
import { isSequenceFile } from "../upload/folderZip";
import { errorsFrom, fromMeta, validateMeta, type MetaErrors, type MetaFormValues } from "../upload/metaForm";
import { CaptureRateConfirm } from "./CaptureRateConfirm";
import { ClipMetaFields } from "./ClipMetaFields";
import { ProgressBar } from "./ProgressBar";
import { extractionShare, extractionView } from "../model/extraction";
import { clipChanged } from "@/entities/clip";

type Phase =
  | { name: "details" }
  | { name: "uploading"; retrying?: number }
  | { name: "paused" }
  | { name: "checking" }
  | { name: "done"; clip: ClipSummary }
  | { name: "error"; problem: UploadProblem };

interface Props {
  file: File;
  teamId: string;
  options: ClipOptions;
  initial: MetaFormValues;
  /** Increments when "Upload all" is pressed. */
  startAll: number;
  onValues: (v: MetaFormValues) => void;
  onRemove: () => void;
  idPrefix: string;
  /** Frames in a folder zipped here (an image sequence). */
  frames?: number;
}

export function UploadItem({ file, teamId, options, initial, startAll, onValues, onRemove, idPrefix, frames }: Props) {
  const sequence = isSequenceFile(file);
  const qc = useQueryClient();
  const [values, setValues] = useState<MetaFormValues>(initial);
  const [errors, setErrors] = useState<MetaErrors>({});
  const [phase, setPhase] = useState<Phase>({ name: "details" });
  const [sent, setSent] = useState(0);
  const [resumable, setResumable] = useState(false);
  const upload = useRef<ClipUpload | null>(null);

  // The same file chosen again after a reload: its interrupted upload and details come back.
  useEffect(() => {
    let live = true;
    void rememberedMeta(file, teamId).then((m) => {
      if (!live || !m) return;
      setValues(fromMeta(m));
      setResumable(true);
    });
    return () => {
      live = false;
    };
  }, [file, teamId]);

  const begin = async () => {
    const checked = validateMeta(values, { sequence });
    if (!checked.meta) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    onValues(values);
    setPhase({ name: "uploading" });
    upload.current = createClipUpload(file, teamId, checked.meta, {
      onProgress: (s, total) => {
        setSent(s);
        setPhase((p) => (s >= total ? { name: "checking" } : p.name === "uploading" && p.retrying ? { name: "uploading" } : p));
      },
      onRetrying: (attempt) => setPhase({ name: "uploading", retrying: attempt }),
      onSuccess: (clip) => {
        setPhase({ name: "done", clip });
        void clipChanged(qc, teamId, { options: true });
      },
      onError: (problem) => {
        if (problem.kind === "invalid_details") {
          setErrors(errorsFrom(problem.fields));
          setPhase({ name: "details" });
        } else setPhase({ name: "error", problem });
      },
    });
    await upload.current.start();
  };

  const lastStart = useRef(startAll);
  useEffect(() => {
    if (startAll !== lastStart.current && phase.name === "details") void begin();
    lastStart.current = startAll;
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [startAll]);

  const pause = async () => {
    await upload.current?.pause();
    setPhase({ name: "paused" });
  };
  const resume = async () => {
    setPhase({ name: "uploading" });
    await upload.current?.start();
  };
  const cancel = async () => {
    await upload.current?.cancel();
    onRemove();
  };

  const bytes = `${formatBytes(sent)} of ${formatBytes(file.size)}`;
  const share = file.size ? sent / file.size : 0;
  const busy = phase.name === "uploading" || phase.name === "checking" || phase.name === "paused";

  return (
    <li className="rounded-[var(--radius-card)] border border-line bg-surface shadow-[var(--shadow-card)]" aria-label={`Upload of ${file.name}`}>
      <header className="flex flex-wrap items-center justify-between gap-2 border-b border-line px-5 py-3">
        <div className="min-w-0">
          <p className="truncate font-medium text-ink" title={file.name}>{file.name}</p>
          <p className="text-xs text-ink-muted">
            {sequence && <Badge tone="accent" className="mr-2">Image sequence</Badge>}
            {frames ? `${formatCount(frames)} frames · ` : ""}{formatBytes(file.size)}
          </p>
        </div>
        <div className="flex items-center gap-2">
          {phase.name === "details" && (
            <>
              <Button variant="ghost" size="sm" onClick={onRemove}>Remove</Button>
              <Button size="sm" onClick={() => void begin()}>{resumable ? "Resume upload" : "Upload"}</Button>
            </>
          )}
          {phase.name === "uploading" && (
            <Button variant="secondary" size="sm" onClick={() => void pause()}>Pause</Button>
          )}
          {(phase.name === "paused" || (phase.name === "error" && phase.problem.kind === "network")) && (
            <Button size="sm" onClick={() => void resume()}>Resume</Button>
          )}
          {busy && phase.name !== "checking" && (
            <Button variant="ghost-danger" size="sm" onClick={() => void cancel()}>Cancel</Button>
          )}
          {(phase.name === "done" || (phase.name === "error" && phase.problem.kind !== "network")) && (
            <Button variant="ghost" size="sm" onClick={onRemove}>Clear</Button>
          )}
        </div>
      </header>
      <div className="px-5 py-4">
        {phase.name === "details" && (
          <>
            {resumable && (
              <Alert tone="info" className="mb-4">
                An earlier upload of this file was interrupted. Its details are filled in; press Resume upload to continue from where it stopped.
              </Alert>
            )}
            <ClipMetaFields idPrefix={idPrefix} sequence={sequence} values={values} errors={errors} options={options} onChange={(p) => setValues((v) => ({ ...v, ...p }))} />
          </>
        )}
        {phase.name === "uploading" && (
          <div className="flex flex-col gap-2">
            <ProgressBar value={share} label={`${Math.floor(share * 100)} % · ${bytes}`} />
            {phase.retrying ? (
              <p className="text-sm text-warn">Connection lost — trying again (attempt {phase.retrying})… What was sent is kept.</p>
            ) : (
              <p className="text-sm text-ink-muted">Uploading. You can pause, or even close the page: choose the same file again to continue.</p>
            )}
          </div>
        )}
        {phase.name === "paused" && (
          <div className="flex flex-col gap-2">
            <ProgressBar value={share} tone="warn" label={`Paused · ${bytes}`} />
          </div>
        )}
        {phase.name === "checking" && <Spinner showLabel label={sequence ? "Checking every frame and storing the sequence…" : "Checking the video and storing it…"} />}
        {phase.name === "error" && <UploadError problem={phase.problem} sentLabel={bytes} share={share} sequence={sequence} />}
        {phase.name === "done" && <UploadDone teamId={teamId} clip={phase.clip} />}
      </div>
    </li>
  );
}

const problemTitle: Record<UploadProblem["kind"], string> = {
  network: "Network aborted", too_large: "Too large", quota: "Plan storage full", duplicate: "Already uploaded", invalid_file: "Not a usable video",
  invalid_details: "Check the details", signed_out: "Signed out", not_allowed: "Not allowed", server: "Upload failed",
};

function UploadError({ problem, sentLabel, share, sequence }: { problem: UploadProblem; sentLabel: string; share: number; sequence: boolean }) {
  return (
    <div className="flex flex-col gap-2">
      {problem.kind === "network" && <ProgressBar value={share} tone="warn" label={sentLabel} />}
      <Alert tone={problem.kind === "network" ? "warn" : "danger"} title={sequence && problem.kind === "invalid_file" ? "Not a usable sequence" : problemTitle[problem.kind]}>
        <p>{problem.message}</p>
        {problem.existingClipId && (
          <p className="mt-1">
            <Link className="font-medium underline" to={`/clips/${problem.existingClipId}`}>Open the clip that is already there</Link>
          </p>
        )}
      </Alert>
    </div>
  );
}

function UploadDone({ teamId, clip: uploaded }: { teamId: string; clip: ClipSummary }) {
  const clip = useClip(teamId, uploaded.id).data ?? uploaded;
  const view = extractionView(clip, useClipProgress(teamId, clip.id, clip.status === "extracting"));
  const { status, framesDone, frameCount: total } = view;
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
        <Badge tone="ok">Stored</Badge>
        <span className="text-ink-muted">
          {formatCount(clip.frameCount)} frames · {clip.width} × {clip.height} · stored at {formatFps(clip.storedFps)}
          {clip.captureFpsConfirmed && ` · captured at ${formatFps(clip.captureFps)}`}
        </span>
        <Link className="font-medium text-accent hover:underline" to={`/clips/${clip.id}`}>Open clip</Link>
      </div>
      {status === "failed" ? (
        <Alert tone="danger" title="Frame extraction failed">{view.failureReason ?? "Open the clip to see why and retry."}</Alert>
      ) : (
        <ProgressBar value={extractionShare(view)} tone="accent"
          label={status === "ready" ? "All frames ready" : `Extracting frames: ${formatCount(framesDone)} of ${formatCount(total)}`} />
      )}
      {clip.needsCaptureRateConfirmation && <CaptureRateConfirm teamId={teamId} clip={clip} />}
    </div>
  );
}
