import { useState } from "react";
import { Alert, Button, Dialog, toast } from "@/components/ui";
import { usePlayers } from "@/entities/member/players";
import { errorMessage } from "@/lib/api";
import type { ShareResponse, ShotReadout } from "@shared/schemas/readout";
import { useShareShot } from "../api/shareShot";

function summary(r: ShareResponse): string {
  const mailed = r.recipients.filter((x) => x.mailed).map((x) => x.name);
  const quiet = r.recipients.filter((x) => !x.mailed).map((x) => `${x.name} (${x.note ?? "no e-mail"})`);
  return [r.published ? "Published." : "", mailed.length ? `E-mailed ${mailed.join(", ")}.` : "", quiet.length ? `Not e-mailed: ${quiet.join("; ")}.` : ""].filter(Boolean).join(" ");
}

/**
 * A coach shares the shot with its player, with teammates (players of the team, e.g. to show a
 * good example) and, if wanted, the team's staff. Players only ever see published shots, so
 * sharing with any player publishes it. Each new recipient gets an e-mail unless they turned it off.
 */
export function ShareDialog({ teamId, readout: r, open, onClose }: { teamId: string; readout: ShotReadout; open: boolean; onClose: () => void }) {
  const share = useShareShot(teamId, r.shot.id);
  const players = usePlayers(teamId);
  const hasPlayer = !!r.shot.playerId;
  const already = new Set(r.shares.map((s) => s.userId));
  const teammates = (players.data?.players ?? []).filter((p) => p.id !== r.shot.playerId);
  const [player, setPlayer] = useState(hasPlayer);
  const [picked, setPicked] = useState<string[]>([]);
  const [staff, setStaff] = useState(false);
  const toPlayers = (player && hasPlayer) || picked.length > 0;
  const submit = () =>
    share.mutate(
      { player: player && hasPlayer, staff, teammates: picked },
      {
        onSuccess: (res) => {
          toast.success(summary(res), "Shot shared");
          onClose();
        },
      },
    );
  const toggle = (id: string) => setPicked((p) => (p.includes(id) ? p.filter((x) => x !== id) : [...p, id]));
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
          <Button onClick={submit} loading={share.isPending} disabled={!toPlayers && !staff}>
            {toPlayers && !r.publication ? "Publish and share" : "Share"}
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <label className="flex items-start gap-3 text-sm">
          <input type="checkbox" className="mt-0.5 size-4 accent-accent" checked={player && hasPlayer} disabled={!hasPlayer} onChange={(e) => setPlayer(e.target.checked)} />
          <span>
            <span className="font-medium">{hasPlayer ? r.shot.playerName : "The player"}</span>
            <span className="block text-ink-muted">{hasPlayer ? "The player who took the shot." : "This shot has no player yet: set it on the Digitise page."}</span>
          </span>
        </label>
        <fieldset className="text-sm">
          <legend className="font-medium">Teammates</legend>
          <p className="text-ink-muted">Players of the team who see this shot while it stays published, e.g. as an example to follow.</p>
          {players.isPending ? (
            <p className="mt-2 text-ink-muted">Loading the team's players…</p>
          ) : teammates.length === 0 ? (
            <p className="mt-2 text-ink-muted">No other players in this team yet.</p>
          ) : (
            <ul className="mt-2 grid max-h-52 gap-1 overflow-y-auto rounded-lg border border-line p-2 sm:grid-cols-2">
              {teammates.map((t) => (
                <li key={t.id}>
                  <label className="flex min-h-9 items-center gap-2.5 rounded-md px-2 hover:bg-sunken">
                    <input type="checkbox" className="size-4 accent-accent" checked={picked.includes(t.id) || already.has(t.id)} disabled={already.has(t.id)} onChange={() => toggle(t.id)} />
                    <span className="min-w-0 truncate">{t.name}</span>
                    {already.has(t.id) && <span className="ml-auto text-xs text-ink-muted">shared</span>}
                  </label>
                </li>
              ))}
            </ul>
          )}
        </fieldset>
        <label className="flex items-start gap-3 text-sm">
          <input type="checkbox" className="mt-0.5 size-4 accent-accent" checked={staff} onChange={(e) => setStaff(e.target.checked)} />
          <span>
            <span className="font-medium">The team's staff</span>
            <span className="block text-ink-muted">Every coach, analyst and team admin (they can already see it; this sends them the link).</span>
          </span>
        </label>
        {toPlayers && !r.publication && (
          <p className="rounded-md bg-gold-soft px-3 py-2 text-sm text-ink" role="note">
            This shot is still in review: sharing it with players publishes it{hasPlayer ? `, so ${r.shot.playerName} sees it too` : ""}.
          </p>
        )}
        {share.isError && <Alert tone="danger">{errorMessage(share.error)}</Alert>}
      </div>
    </Dialog>
  );
}
