import { useState } from "react";
import { Button, toast } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { formatDate } from "@/lib/format";
import type { ShotReadout } from "@shared/schemas/readout";
import { usePublishShot } from "../api/publishShot";

/**
 * The review step, for staff: a shot waits here until a coach publishes it to its player (players
 * never see a shot in review, nor teammates it is shared with). Taking it back hides it again.
 */
export function ReviewBar({ teamId, r }: { teamId: string; r: ShotReadout }) {
  const publish = usePublishShot(teamId, r.shot.id);
  const [notify, setNotify] = useState(true);
  const player = r.shot.playerName;
  const p = r.publication;
  const act = (v: Parameters<typeof publish.mutate>[0]) =>
    publish.mutate(v, {
      onSuccess: (res) =>
        v.publish
          ? toast.success(res.mailed ? `${player} has an e-mail with the link.` : res.note ? `Not e-mailed: ${res.note}.` : `${player ?? "Its player"} can open it now.`, "Published")
          : toast.success(`${player ?? "Its player"} and any teammate it was shared with no longer see it.`, "Back in review"),
      onError: (e) => toast.error(errorMessage(e), v.publish ? "Could not publish" : "Could not take it back"),
    });

  if (p)
    return (
      <div className="mb-4 flex flex-wrap items-center gap-x-4 gap-y-2 rounded-lg border border-ok/25 bg-ok-soft px-4 py-2.5 text-sm" data-testid="review-bar" data-state="published">
        <span className="flex-[1_1_16rem] text-ink">
          <b className="font-semibold text-ok">Published</b> to {player ?? "its player"} on {formatDate(p.publishedAt)}
          {p.publishedByName ? ` by ${p.publishedByName}` : " (the team publishes results automatically)"}.
        </span>
        {r.can.publish && (
          <Button size="sm" variant="secondary" loading={publish.isPending} onClick={() => act({ publish: false })}>
            Take back to review
          </Button>
        )}
      </div>
    );
  return (
    <div className="mb-4 flex flex-wrap items-center gap-x-4 gap-y-2 rounded-lg border border-gold/60 bg-gold-soft px-4 py-2.5 text-sm" data-testid="review-bar" data-state="review">
      <span className="flex-[1_1_16rem] text-ink">
        <b className="font-semibold">In review</b> — only staff see this shot.{" "}
        {player ? `${player} sees it once a coach publishes it.` : "Set its player on the Digitise page before publishing."}
      </span>
      {r.can.publish && player && (
        <>
          <label className="flex items-center gap-2 text-ink-muted">
            <input type="checkbox" className="size-4 accent-accent" checked={notify} onChange={(e) => setNotify(e.target.checked)} />
            E-mail {player.split(/\s+/)[0]}
          </label>
          <Button size="sm" loading={publish.isPending} onClick={() => act({ publish: true, body: { notify } })}>
            Publish to {player.split(/\s+/)[0]}
          </Button>
        </>
      )}
    </div>
  );
}
