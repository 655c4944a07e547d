import { useState } from "react";
import { Alert, Button, Dialog, toast } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import type { ShareResponse, ShotReadout } from "@shared/schemas/readout";
import { useShareShot } from "../api/shareShot";

function summary(r: ShareResponse): string {
  const mailed = r.recipients.filter((x) => x.mailed).map((x) => x.name);
  const quiet = r.recipients.filter((x) => !x.mailed).map((x) => `${x.name} (${x.note ?? "no e-mail"})`);
  return [mailed.length ? `E-mailed ${mailed.join(", ")}.` : "", quiet.length ? `Not e-mailed: ${quiet.join("; ")}.` : ""].filter(Boolean).join(" ");
}

/** A coach shares the shot with its player and, if wanted, the team's staff; each gets an e-mail unless they turned it off. */
export function ShareDialog({ teamId, readout: r, open, onClose }: { teamId: string; readout: ShotReadout; open: boolean; onClose: () => void }) {
  const share = useShareShot(teamId, r.shot.id);
  const hasPlayer = !!r.shot.playerId;
  const [player, setPlayer] = useState(hasPlayer);
  const [staff, setStaff] = useState(false);
  const submit = () =>
    share.mutate(
      { player: player && hasPlayer, staff },
      {
        onSuccess: (res) => {
          toast.success(summary(res), "Shot shared");
          onClose();
        },
      },
    );
  return (
    <Dialog
      open={open}
      onClose={() => !share.isPending && onClose()}
      title="Share this shot"
      description="They get an e-mail with a link to this readout, unless they have turned those e-mails off."
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={share.isPending}>
            Cancel
          </Button>
          <Button onClick={submit} loading={share.isPending} disabled={!(player && hasPlayer) && !staff}>
            Share
          </Button>
        </>
      }
    >
      <fieldset className="flex flex-col gap-3">
        <legend className="sr-only">Share with</legend>
        <label className="flex items-start gap-3 text-sm">
          <input type="checkbox" className="mt-0.5 size-4 accent-accent" checked={player && hasPlayer} disabled={!hasPlayer} onChange={(e) => setPlayer(e.target.checked)} />
          <span>
            <span className="font-medium">{hasPlayer ? r.shot.playerName : "The player"}</span>
            <span className="block text-ink-muted">{hasPlayer ? "The player who took the shot." : "This shot has no player yet: set it on the Digitise page."}</span>
          </span>
        </label>
        <label className="flex items-start gap-3 text-sm">
          <input type="checkbox" className="mt-0.5 size-4 accent-accent" checked={staff} onChange={(e) => setStaff(e.target.checked)} />
          <span>
            <span className="font-medium">The team's staff</span>
            <span className="block text-ink-muted">Every coach, analyst and team admin (they can already see it; this sends them the link).</span>
          </span>
        </label>
      </fieldset>
      {share.isError && <Alert tone="danger">{errorMessage(share.error)}</Alert>}
    </Dialog>
  );
}
