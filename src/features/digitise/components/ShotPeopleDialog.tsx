import { useState } from "react";
import type { ShotSummary } from "@shared/schemas/shots";
import { Alert, Button, Dialog, Field, PageSpinner, Select, toast } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import { useUpdateShot } from "../api/updateShot";
import { useClipOptions } from "@/entities/clip";

/**
 * Staff correct who took a shot and with which stick. The player decides who may see the shot
 * (the player sees their own shots), the stick which stiffness its results use.
 */
export function ShotPeopleDialog({ teamId, shot, open, onClose }: { teamId: string; shot: ShotSummary; open: boolean; onClose: () => void }) {
  const options = useClipOptions(teamId, open);
  const update = useUpdateShot(teamId, shot.id);
  const [playerId, setPlayerId] = useState(shot.playerId ?? "");
  const [stickId, setStickId] = useState(shot.stickId ?? "");
  const problems = Object.fromEntries((isApiError(update.error) ? update.error.errors : []).map((e) => [e.path, e.message]));
  const unchanged = playerId === (shot.playerId ?? "") && stickId === (shot.stickId ?? "");
  const players = options.data?.players ?? [];
  // A former member stays choosable as the shot's current player until someone else is picked.
  const listed = !shot.playerId || players.some((p) => p.id === shot.playerId);

  const save = () =>
    update.mutate(
      {
        ...(playerId !== (shot.playerId ?? "") ? { playerId: playerId || null } : {}),
        ...(stickId !== (shot.stickId ?? "") ? { stickId: stickId || null } : {}),
      },
      {
        onSuccess: () => {
          toast.success("The shot's player and stick are saved.", "Saved");
          onClose();
        },
      },
    );

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Player and stick"
      description={shot.label || `Shot, frames ${shot.frameStart}–${shot.frameEnd}`}
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>Cancel</Button>
          <Button onClick={save} loading={update.isPending} disabled={unchanged}>Save</Button>
        </>
      }
    >
      {!options.data ? (
        <PageSpinner label="Loading players and sticks…" />
      ) : (
        <div className="flex flex-col gap-4">
          <Field label="Player" hint="The player sees their own shots; the previous player no longer does." error={problems.playerId}>
            <Select value={playerId} onChange={(e) => setPlayerId(e.target.value)}>
              <option value="">No player</option>
              {!listed && <option value={shot.playerId!}>{shot.playerName ?? "A former member"}</option>}
              {players.map((p) => (
                <option key={p.id} value={p.id}>{p.name}</option>
              ))}
            </Select>
          </Field>
          <Field label="Stick" hint="Stored energy uses this stick's stiffness on the shot's date." error={problems.stickId}>
            <Select value={stickId} onChange={(e) => setStickId(e.target.value)}>
              <option value="">Not recorded</option>
              {options.data.sticks.map((s) => (
                <option key={s.id} value={s.id}>{s.label}</option>
              ))}
            </Select>
          </Field>
          {update.isError && !Object.keys(problems).length && <Alert tone="danger">{errorMessage(update.error)}</Alert>}
        </div>
      )}
    </Dialog>
  );
}
