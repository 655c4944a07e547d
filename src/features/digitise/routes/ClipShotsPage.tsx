import { useState } from "react";
import { Link, useNavigate, useParams } from "react-router-dom";
import { EVENTS, LANDMARKS, landmarkLabels, type ShotSummary } from "@shared/schemas/shots";
import { Alert, Badge, Button, Card, ConfirmDialog, EmptyState, Field, Input, PageHeader, PageSpinner, toast } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import { formatRelative } from "@/lib/format";
import { useActiveTeam } from "@/lib/session";
import { useUnits } from "@/lib/units";
import { useClipShots } from "../api/clipShots";
import { useCreateShot } from "../api/createShot";
import { useDeleteShot } from "../api/deleteShot";
import { landmarkColour } from "../model/style";
import { ShotPeopleDialog } from "../components/ShotPeopleDialog";

/** /clips/:clipId/shots — the shots marked in one clip, and a form to mark out a new one. */
export function Component() {
  const { clipId = "" } = useParams();
  const team = useActiveTeam();
  const q = useClipShots(team?.id ?? "", clipId);
  if (!team) return <EmptyState title="No team yet">Shots belong to a team; ask a team admin for an invitation.</EmptyState>;
  if (q.isPending) return <PageSpinner label="Loading the clip's shots…" />;
  if (q.isError)
    return (
      <Alert tone="danger" title={isApiError(q.error) && q.error.status === 404 ? "This clip is not available" : "Couldn't load the shots"}>
        {errorMessage(q.error)}
      </Alert>
    );
  const { clip, shots, canEdit } = q.data;
  return (
    <>
      <PageHeader
        eyebrow={<Link to="/clips" className="hover:underline">Clips</Link>}
        title={clip.title || "Clip"}
        description={`${clip.captureFps.toLocaleString()} fps capture · ${clip.frameCount.toLocaleString()} frames · ${clip.width} × ${clip.height} px · ${clip.calibration ? (clip.calibration.type === "scaleBar" ? "scale bar calibration" : "plane calibration") : "no calibration yet"}`}
      />
      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="flex flex-col gap-3">
          {shots.length === 0 ? (
            <EmptyState title="No shots in this clip yet">{canEdit ? "Mark out the frames of a shot on the right, then digitise it." : "When an analyst digitises a shot of yours, it shows here."}</EmptyState>
          ) : (
            shots.map((s) => <ShotRow key={s.id} teamId={team.id} clipId={clip.id} shot={s} canEdit={canEdit} />)
          )}
        </div>
        {canEdit && <NewShotForm teamId={team.id} clipId={clip.id} frameCount={clip.frameCount} ready={clip.status === "ready"} existing={shots} />}
      </div>
    </>
  );
}

function ShotRow({ teamId, clipId, shot, canEdit }: { teamId: string; clipId: string; shot: ShotSummary; canEdit: boolean }) {
  const units = useUnits();
  const del = useDeleteShot(teamId);
  const [confirm, setConfirm] = useState(false);
  const [people, setPeople] = useState(false);
  const events = EVENTS.filter((k) => shot.events[k] !== undefined).length;
  return (
    <Card data-testid="clip-shot-row">
      <div className="flex flex-wrap items-center gap-x-6 gap-y-3">
      <div className="min-w-48 flex-1">
        <Link to={`/clips/${clipId}/shots/${shot.id}/digitise`} className="font-semibold text-ink hover:text-accent-strong hover:underline">
          {shot.label || `Shot, frames ${shot.frameStart}–${shot.frameEnd}`}
        </Link>
        <p className="text-sm text-ink-muted">
          {shot.playerName ?? "No player"}{shot.stickLabel && ` · ${shot.stickLabel}`} · frames {shot.frameStart}–{shot.frameEnd} · saved {formatRelative(shot.updatedAt)}
          {shot.updatedByName && ` by ${shot.updatedByName}`}
        </p>
      </div>
      <div className="flex items-center gap-1" title={LANDMARKS.map((l) => `${landmarkLabels[l]}: ${shot.markCounts[l] ?? 0}`).join("\n")}>
        {LANDMARKS.map((l) => (
          <span key={l} className="flex h-6 min-w-8 items-center justify-center gap-1 rounded bg-sunken px-1.5 font-mono text-[11px] text-ink-muted">
            <span className="size-2 rounded-full" style={{ background: landmarkColour[l], opacity: shot.markCounts[l] ? 1 : 0.3 }} />
            {shot.markCounts[l] ?? 0}
          </span>
        ))}
      </div>
      <Badge tone={events === 4 ? "ok" : "neutral"}>
        {events}/4 events
      </Badge>
      <div className="w-40 text-right text-sm">
        {shot.result?.recomputing ? (
          <span className="text-ink-muted" title="The clip's calibration or the stick changed; new results are being computed.">
            recomputing…
          </span>
        ) : shot.result?.puckExitSpeedMps != null ? (
          <span className="font-mono font-semibold text-ink">{units.format("speed", shot.result.puckExitSpeedMps)}</span>
        ) : (
          <span className="text-ink-faint" title={shot.result?.error ?? undefined}>
            no result yet
          </span>
        )}
      </div>
      <div className="flex gap-2">
        <Link to={`/clips/${clipId}/shots/${shot.id}/digitise`} className="inline-flex h-8 items-center rounded-lg bg-accent px-3 text-sm font-medium text-accent-ink hover:bg-accent-strong">
          {canEdit ? "Digitise" : "View"}
        </Link>
        {canEdit && (
          <Button size="sm" variant="secondary" onClick={() => setPeople(true)}>
            Player and stick
          </Button>
        )}
        {canEdit && (
          <Button size="sm" variant="ghost-danger" onClick={() => setConfirm(true)}>
            Delete
          </Button>
        )}
      </div>
      {people && <ShotPeopleDialog teamId={teamId} shot={shot} open onClose={() => setPeople(false)} />}
      <ConfirmDialog
        open={confirm}
        onCancel={() => setConfirm(false)}
        pending={del.isPending}
        title="Delete this shot?"
        description={`Its ${Object.values(shot.markCounts).reduce((a, b) => a + (b ?? 0), 0)} marks, events and results go. The clip and its other shots stay.`}
        confirmLabel="Delete shot"
        onConfirm={() =>
          del.mutate(shot.id, {
            onSuccess: () => toast.success("Shot deleted."),
            onSettled: () => setConfirm(false),
          })
        }
      />
      </div>
    </Card>
  );
}

function NewShotForm({ teamId, clipId, frameCount, ready, existing }: { teamId: string; clipId: string; frameCount: number; ready: boolean; existing: ShotSummary[] }) {
  const navigate = useNavigate();
  const create = useCreateShot(teamId, clipId);
  const lastEnd = existing.reduce((m, s) => Math.max(m, s.frameEnd), 0);
  const [label, setLabel] = useState(`Shot ${existing.length + 1}`);
  const [start, setStart] = useState(String(Math.min(frameCount, lastEnd + 1) || 1));
  const [end, setEnd] = useState(String(frameCount));
  const problems = Object.fromEntries((isApiError(create.error) ? create.error.errors : []).map((e) => [e.path, e.message]));
  return (
    <Card title="New shot" description="A clip may hold several shots: give this one its frames. Player and stick follow the clip.">
      {!ready && <Alert tone="warn" className="mt-3">The clip's frames are still being extracted.</Alert>}
      <form
        className="flex flex-col gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          create.mutate(
            { label, frameStart: Number(start), frameEnd: Number(end) },
            { onSuccess: (shot) => navigate(`/clips/${clipId}/shots/${shot.id}/digitise`) },
          );
        }}
      >
        <Field label="Label" error={problems.label}>
          <Input value={label} onChange={(e) => setLabel(e.target.value)} maxLength={80} />
        </Field>
        <div className="grid grid-cols-2 gap-3">
          <Field label="First frame" error={problems.frameStart}>
            <Input inputMode="numeric" value={start} onChange={(e) => setStart(e.target.value.replace(/\D/g, ""))} />
          </Field>
          <Field label="Last frame" hint={`of ${frameCount}`} error={problems.frameEnd}>
            <Input inputMode="numeric" value={end} onChange={(e) => setEnd(e.target.value.replace(/\D/g, ""))} />
          </Field>
        </div>
        {create.isError && !Object.keys(problems).length && <Alert tone="danger">{errorMessage(create.error)}</Alert>}
        <Button type="submit" loading={create.isPending} disabled={!ready}>
          Create and digitise
        </Button>
      </form>
    </Card>
  );
}
