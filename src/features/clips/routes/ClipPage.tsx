import { useEffect, useRef, useState } from "react";
import { useNavigate, useParams, useSearchParams } from "react-router-dom";
import { Alert, Button, ButtonLink, Card, ConfirmDialog, EmptyState, PageHeader, PageSpinner, toast } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import { useActiveTeam } from "@/lib/session";
import { useClip } from "../api/clip";
import { useClipProgress } from "../api/clipProgress";
import { useClipDeletionCounts, useDeleteClip } from "../api/deleteClip";
import { deletionText } from "../model/deletion";
import { useRetryClip } from "../api/retryClip";
import { CaptureRateConfirm } from "../components/CaptureRateConfirm";
import { ClipFacts } from "../components/ClipFacts";
import { TimingWarning } from "../components/TimingWarning";
import { EditClipDialog } from "../components/EditClipDialog";
import { FrameStrip, FrameViewer } from "../components/FrameViewer";
import { FrameStepper } from "@/components/shot/stepping/frame-stepper";
import { ProgressBar } from "../components/ProgressBar";
import { extractionView } from "../model/extraction";
import { formatCount, sessionLabel } from "../format";
import { cameraViewLabels, shotTypeLabels } from "@shared/schemas/clips";

export function Component() {
  const team = useActiveTeam();
  const { clipId = "" } = useParams();
  if (!team) return <EmptyState title="No team yet" />;
  return <ClipView teamId={team.id} clipId={clipId} staff={team.role !== "player"} />;
}

function ClipView({ teamId, clipId, staff }: { teamId: string; clipId: string; staff: boolean }) {
  const navigate = useNavigate();
  const clip = useClip(teamId, clipId);
  const live = useClipProgress(teamId, clipId, clip.data?.status === "extracting");
  const retry = useRetryClip(teamId);
  const remove = useDeleteClip(teamId);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const deletion = useClipDeletionCounts(teamId, clipId, confirmDelete);
  const [params, setParams] = useSearchParams();
  // The frame lives in the stepper (synchronous, so no key press is lost); the address follows it.
  const [stepper] = useState(() => new FrameStepper(1, 1, Number(params.get("frame")) || 1));
  // The frame the address asked for, gone to once it exists (a clip may still be extracting).
  const pendingOpen = useRef(Number(params.get("frame")) || 1);
  const [editing, setEditing] = useState(false);

  const shown = clip.data ? extractionView(clip.data, live) : null;
  const liveStatus = shown?.status;
  const frames = liveStatus === "ready" ? clip.data?.frameCount ?? 0 : shown?.framesDone ?? 0;
  useEffect(() => {
    stepper.setRange(1, Math.max(1, frames));
    if (pendingOpen.current > 1 && (frames >= pendingOpen.current || liveStatus === "ready")) {
      stepper.goto(pendingOpen.current);
      pendingOpen.current = 0;
    }
  }, [stepper, frames, liveStatus]);
  useEffect(() => {
    let timer = 0;
    const off = stepper.subscribe(() => {
      clearTimeout(timer);
      timer = window.setTimeout(() => setParams((p) => { p.set("frame", String(stepper.getState().frame)); return p; }, { replace: true }), 250);
    });
    return () => {
      off();
      clearTimeout(timer);
    };
  }, [stepper, setParams]);

  if (clip.isPending) return <PageSpinner label="Loading the clip…" />;
  if (clip.isError)
    return isApiError(clip.error) && clip.error.status === 404 ? (
      <EmptyState title="Clip not found" action={<ButtonLink to="/clips">Back to clips</ButtonLink>}>It may have been deleted, or it belongs to another team.</EmptyState>
    ) : (
      <Alert tone="danger" title="Couldn't load the clip">{errorMessage(clip.error)}</Alert>
    );

  const c = clip.data;
  const { status, framesDone, failureReason } = shown!;
  const available = status === "ready" ? c.frameCount ?? 0 : framesDone;
  const openFrame1 = () => {
    stepper.goto(1);
    document.getElementById("frame-viewer")?.focus();
  };

  return (
    <>
      <PageHeader
        eyebrow={sessionLabel(c.session)}
        title={c.title || c.originalName}
        description={[c.player?.name, shotTypeLabels[c.shotType], `${cameraViewLabels[c.cameraView]} view`].filter(Boolean).join(" · ")}
        actions={
          <>
            <ButtonLink to="/clips" variant="ghost">All clips</ButtonLink>
            <Button variant="secondary" onClick={openFrame1} disabled={available < 1}>Open frame 1</Button>
            {status === "ready" && <ButtonLink to={`/clips/${c.id}/shots`}>{staff ? "Shots and digitising" : "Shots"}</ButtonLink>}
            {staff && <Button variant="secondary" onClick={() => setEditing(true)}>Edit details</Button>}
            {staff && <Button variant="ghost-danger" onClick={() => setConfirmDelete(true)}>Delete</Button>}
          </>
        }
      />
      <div className="flex flex-col gap-4">
        {status === "extracting" && (
          <Card>
            <ProgressBar value={c.frameCount ? framesDone / c.frameCount : 0} label={`Extracting frames: ${formatCount(framesDone)} of ${formatCount(c.frameCount)}`} />
          </Card>
        )}
        {status === "failed" && (
          <Alert tone="danger" title="Frame extraction failed">
            <p>{failureReason}</p>
            {staff && (
              <Button size="sm" variant="secondary" className="mt-2" loading={retry.isPending}
                onClick={() => retry.mutate(c.id, { onSuccess: () => { toast.success("Extraction queued again.", "Retrying"); void clip.refetch(); } })}>
                Retry
              </Button>
            )}
          </Alert>
        )}
        {c.needsCaptureRateConfirmation && staff && <CaptureRateConfirm teamId={teamId} clip={c} />}
        {c.needsCaptureRateConfirmation && !staff && (
          <Alert tone="warn">The capture rate of this clip has not been confirmed yet, so speeds from it may be wrong.</Alert>
        )}
        <TimingWarning clip={c} />
        <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
          <Card title="Frames" description="Step through the clip frame by frame; the time shown is real time from the capture rate.">
            <div className="flex flex-col gap-4">
              <FrameViewer clip={c} stepper={stepper} available={available} />
              <FrameStrip clip={c} onFrame={(n) => stepper.goto(n)} />
            </div>
          </Card>
          <ClipFacts clip={c} />
        </div>
      </div>
      {editing && <EditClipDialog teamId={teamId} clip={c} open={editing} onClose={() => setEditing(false)} />}
      <ConfirmDialog
        open={confirmDelete}
        title="Delete this clip?"
        description={deletionText(deletion.data)}
        confirmLabel="Delete clip"
        pending={remove.isPending}
        onCancel={() => setConfirmDelete(false)}
        onConfirm={() => remove.mutate(c.id, { onSuccess: () => { toast.success("The clip and its frames are deleted.", "Deleted"); navigate("/clips"); } })}
      />
    </>
  );
}
