import { useParams } from "react-router-dom";
import { Alert, ButtonLink, EmptyState, PageSpinner } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import { useActiveTeam } from "@/lib/session";
import { useShot } from "../api/shot";
import { Workspace } from "../components/Workspace";

/** /clips/:clipId/shots/:shotId/digitise — the frame-by-frame workspace of one shot. */
export function Component() {
  const { clipId = "", shotId = "" } = useParams();
  const team = useActiveTeam();
  const shot = useShot(team?.id ?? "", shotId);
  if (!team) return <EmptyState title="No team yet">Shots belong to a team; ask a team admin for an invitation.</EmptyState>;
  if (shot.isPending || (!shot.current && !shot.isError)) return <PageSpinner label="Opening the shot…" />;
  if (shot.isError)
    return (
      <Alert tone="danger" title={isApiError(shot.error) && shot.error.status === 404 ? "This shot is not available" : "Couldn't open the shot"}>
        <p>{errorMessage(shot.error)}</p>
        <ButtonLink to={`/clips/${clipId}/shots`} size="sm" className="mt-3">
          Back to the clip's shots
        </ButtonLink>
      </Alert>
    );
  if (!shot.current || shot.current.clip.id !== clipId || shot.current.clip.status !== "ready" || !shot.current.clip.width)
    return (
      <Alert tone="warn" title="The frames of this clip are not ready">
        Digitising opens once every frame of the clip has been extracted.
      </Alert>
    );
  return <Workspace key={shot.current.id} teamId={team.id} shot={shot.current} />;
}
