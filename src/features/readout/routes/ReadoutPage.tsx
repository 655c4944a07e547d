import { useState } from "react";
import { useParams } from "react-router-dom";
import { Alert, Badge, Button, ButtonLink, Card, EmptyState, PageHeader, PageSpinner, toast } from "@/components/ui";
import { digitiseUrl } from "@/components/shot/frames";
import { useTeamFromLink } from "@/components/shot/useTeamFromLink";
import { errorMessage, isApiError } from "@/lib/api";
import { formatDate } from "@/lib/format";
import { useActiveTeam } from "@/lib/session";
import { useUnits } from "@/lib/units";
import { eventTimingText, noteMetric, shotTitle, shotTypeLabels, type ShotReadout } from "@shared/schemas/readout";
import { useReadout } from "../api/readout";
import { useUnshareShot } from "../api/shareShot";
import { ExportButtons } from "../components/ExportButtons";
import { PhaseTimeline } from "../components/PhaseTimeline";
import { ResultCards } from "../components/ResultCards";
import { ReviewBar } from "../components/ReviewBar";
import { ShareDialog } from "../components/ShareDialog";
import { ShotCharts } from "../components/ShotCharts";

/** /readout/:shotId — the numbers, charts and event frames of one shot. */
/** The stiffness in force on the shot's date, short: "flex 80 from the bench test of 10 Jan 2026". */
const stickFlexNote = (st: ShotReadout["stick"]) =>
  !st?.flex ? "" : st.flexSource === "measured" && st.testedOn ? ` · flex ${st.flex.toFixed(0)} from the bench test of ${formatDate(st.testedOn)}` : ` · rated flex ${st.flex.toFixed(0)}`;

export function Component() {
  const { shotId = "" } = useParams();
  const team = useActiveTeam();
  const switching = useTeamFromLink();
  const q = useReadout(team?.id ?? "", shotId, !!team && !switching);
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, your team's shots show here.</EmptyState>;
  if (switching || q.isPending) return <PageSpinner label="Loading the shot…" />;
  if (q.isError) return <ReadoutError error={q.error} retry={() => q.refetch()} />;
  return <Readout teamId={team.id} teamName={team.name} r={q.data} />;
}

function ReadoutError({ error, retry }: { error: unknown; retry: () => void }) {
  const back = <ButtonLink to="/readout">See all shots</ButtonLink>;
  if (isApiError(error) && error.status === 410)
    return (
      <EmptyState title="This shot was deleted" action={back}>
        {error.detail}
      </EmptyState>
    );
  if (isApiError(error) && error.status === 404)
    return (
      <EmptyState title="Shot not found" action={back}>
        {error.detail}
      </EmptyState>
    );
  return (
    <Alert tone="danger" title="Couldn't load the shot">
      <p>{errorMessage(error)}</p>
      <Button variant="secondary" size="sm" className="mt-3" onClick={retry}>
        Try again
      </Button>
    </Alert>
  );
}

function Readout({ teamId, teamName, r }: { teamId: string; teamName: string; r: ShotReadout }) {
  const { system } = useUnits();
  const [sharing, setSharing] = useState(false);
  const title = shotTitle(r.shot);
  const meta = [r.shot.playerName ?? "No player set", shotTypeLabels[r.shot.shotType], formatDate(r.shot.date), r.shot.venue, r.shot.stickLabel && `Stick ${r.shot.stickLabel}${stickFlexNote(r.stick)}`]
    .filter(Boolean)
    .join(" · ");
  const general = r.results?.notes.filter((n) => noteMetric(n.code) === null) ?? [];
  return (
    <>
      <PageHeader
        eyebrow={`Shot readout · ${teamName}`}
        title={title}
        description={
          <>
            {meta}
            <span className="mt-1 block text-sm text-ink-faint">
              {r.clip.captureFps.toLocaleString()} fps capture · {r.clip.calibration === "plane" ? "plane calibration" : r.clip.calibration === "scaleBar" ? "scale-bar calibration" : "not calibrated"} · frames {r.shot.frameStart}–{r.shot.frameEnd}
            </span>
          </>
        }
        actions={
          <>
            <ButtonLink size="sm" to={`/compare?a=${r.shot.id}`}>
              Compare side by side
            </ButtonLink>
            <ButtonLink size="sm" to={digitiseUrl(r.clip.id, r.shot.id)}>
              {r.can.edit ? "Open in Digitise" : "See the marks"}
            </ButtonLink>
            {r.can.share && (
              <Button size="sm" variant="secondary" onClick={() => setSharing(true)}>
                Share…
              </Button>
            )}
          </>
        }
      />
      {r.can.edit && <ReviewBar teamId={teamId} r={r} />}
      <div className="mb-6 flex flex-wrap items-center justify-between gap-3">
        <SharedLine r={r} teamId={teamId} />
        <ExportButtons teamId={teamId} shotId={r.shot.id} units={system} hasResults={!!r.results} />
      </div>

      {r.results ? (
        <div className="flex flex-col gap-6">
          {r.recomputing && (
            <Alert tone="info" title="Recomputing">
              The clip's calibration or the stick's stiffness changed: new numbers are being computed and appear here by themselves. Until then these are the previous ones.
            </Alert>
          )}
          {r.stale && <Alert tone="warn">These results come from an earlier version of the marks; they are recomputed when the marks are saved again.</Alert>}
          <div className={r.recomputing ? "opacity-60 transition-opacity" : "transition-opacity"}>
            <ResultCards results={r.results} units={system} stick={r.stick} />
          </div>
          {general.length > 0 && (
            <Alert tone="warn" title="Check before acting on these numbers">
              <ul className="list-disc pl-5">
                {general.map((n) => (
                  <li key={n.code}>{n.message}</li>
                ))}
              </ul>
            </Alert>
          )}
          <PhaseTimeline teamId={teamId} readout={r} />
          <ShotCharts readout={r} results={r.results} units={system} />
          <p className="text-sm text-ink-faint">
            Values are ± one standard uncertainty ({r.results.uncertainty.trials} Monte Carlo trials at {r.results.uncertainty.pixelErrorPx} px per mark, with the smoothing's estimated
            bias); times {eventTimingText(r.results)} at {r.clip.captureFps.toLocaleString()} fps. Computed {r.computedAt ? formatDate(r.computedAt) : ""} by {r.results.engineVersion}.
          </p>
        </div>
      ) : (
        <div className="flex flex-col gap-6">
          <Card title="No results yet">
            <p className="text-ink" data-testid="missing">
              {r.missing}
            </p>
            <p className="mt-2 text-sm text-ink-muted">
              {r.can.edit
                ? "Open the shot on the Digitise page to add what is missing; the results appear here as soon as the marks are saved."
                : "Your analyst is still digitising this shot; the results appear here once it is done."}
            </p>
            {r.can.edit && (
              <ButtonLink className="mt-4" variant="primary" to={digitiseUrl(r.clip.id, r.shot.id)}>
                Continue digitising
              </ButtonLink>
            )}
          </Card>
          <PhaseTimeline teamId={teamId} readout={r} />
        </div>
      )}
      {r.can.share && <ShareDialog key={String(sharing)} teamId={teamId} readout={r} open={sharing} onClose={() => setSharing(false)} />}
    </>
  );
}

function SharedLine({ r, teamId }: { r: ShotReadout; teamId: string }) {
  if (!r.shares.length) return <span className="text-sm text-ink-faint">{r.can.share ? "Not shared yet." : ""}</span>;
  if (!r.can.share) {
    const mine = r.shares[0];
    return (
      <span className="flex items-center gap-2 text-sm text-ink-muted">
        <Badge tone="accent">Shared with you</Badge>
        {mine.sharedByName ? `by ${mine.sharedByName}, ` : ""}
        {formatDate(mine.sharedAt)}
      </span>
    );
  }
  return (
    <span className="flex flex-wrap items-center gap-2 text-sm text-ink-muted">
      <Badge tone="accent">Shared</Badge>
      with{" "}
      {r.shares.map((s) => (
        <SharedWith key={s.userId} teamId={teamId} shotId={r.shot.id} userId={s.userId} name={s.name} stillSees={s.userId === r.shot.playerId || (!!s.role && s.role !== "player")} />
      ))}
    </span>
  );
}

/** One person the shot is shared with, and the way to take it back. */
function SharedWith({ teamId, shotId, userId, name, stillSees }: { teamId: string; shotId: string; userId: string; name: string; stillSees: boolean }) {
  const unshare = useUnshareShot(teamId, shotId);
  // mutateAsync, not mutate's own onSuccess: the chip leaves the list (and this component unmounts)
  // as soon as the refetch lands, and a per-call callback of an unmounted caller never runs.
  // A failure is reported once by the query client (meta.errorTitle).
  const stop = () =>
    unshare.mutateAsync(userId).then(
      // Taking a share back does not hide the shot from its own player or from staff: say so.
      () => toast.success(`${name} is off the shared list.${stillSees ? " They can still open it: players see their own shots, staff every shot." : ""}`, "Sharing stopped"),
      () => undefined,
    );
  return (
    <span className="inline-flex items-center gap-1 rounded-full border border-line bg-surface px-2 py-0.5 text-ink">
      {name}
      <button
        type="button"
        onClick={stop}
        disabled={unshare.isPending}
        aria-label={`Stop sharing with ${name}`}
        title={`Stop sharing with ${name}`}
        className="rounded-full px-1 text-ink-muted hover:bg-line hover:text-ink disabled:opacity-50"
      >
        ×
      </button>
    </span>
  );
}
