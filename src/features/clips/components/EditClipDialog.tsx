import { useState } from "react";
import { Alert, Button, Dialog, PageSpinner, toast } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import type { ClipDetail } from "@shared/schemas/clips";
import { useClipOptions } from "@/entities/clip";
import { useUpdateClip } from "../api/updateClip";
import { emptyMeta, errorsFrom, validateMeta, type MetaErrors, type MetaFormValues } from "../upload/metaForm";
import { ClipMetaFields } from "./ClipMetaFields";

const valuesOf = (c: ClipDetail): MetaFormValues => ({
  ...emptyMeta(),
  title: c.title, session: c.session?.id ?? "new", playerId: c.player?.id ?? "", shotType: c.shotType, stickId: c.stick?.id ?? "",
  cameraView: c.cameraView, captureFps: String(c.captureFps), captureFpsConfirmed: c.captureFpsConfirmed,
  exposureUs: c.exposureUs === null ? "" : String(c.exposureUs), notes: c.notes,
});

export function EditClipDialog({ teamId, clip, open, onClose }: { teamId: string; clip: ClipDetail; open: boolean; onClose: () => void }) {
  const options = useClipOptions(teamId, open);
  const update = useUpdateClip(teamId, clip.id);
  const [values, setValues] = useState(() => valuesOf(clip));
  const [errors, setErrors] = useState<MetaErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  // The server's question when the new player's clip holds shots of the previous one.
  const [moveAsk, setMoveAsk] = useState<string | null>(null);

  const save = (moveShots?: boolean) => {
    const checked = validateMeta(values);
    if (!checked.meta) return setErrors(checked.errors);
    const { captureFps, ...m } = checked.meta;
    setMoveAsk(null);
    update.mutate(
      {
        ...m, stickId: m.stickId ?? null, exposureUs: m.exposureUs ?? null, ...(captureFps !== undefined ? { captureFps } : {}),
        ...(moveShots !== undefined ? { moveShots } : {}),
      },
      {
        onSuccess: (_clip, body) => {
          const moved = body.moveShots ? " Its shots moved to the new player." : "";
          toast.success(`The clip's details are saved.${moved}`, "Saved");
          onClose();
        },
        onError: (e) => {
          const ask = isApiError(e) ? e.errors.find((x) => x.path === "moveShots") : undefined;
          if (ask) setMoveAsk(ask.message);
          else if (isApiError(e) && e.errors.length) setErrors(errorsFrom(e.errors));
          else setFormError(errorMessage(e));
        },
      },
    );
  };
  const previous = clip.player?.name ?? "the previous player";
  const next = options.data?.players.find((p) => p.id === values.playerId)?.name ?? "the new player";

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Clip details"
      footer={
        moveAsk ? (
          <>
            <Button variant="secondary" onClick={() => setMoveAsk(null)}>Back</Button>
            <Button variant="secondary" onClick={() => save(false)} loading={update.isPending && update.variables?.moveShots === false}>Leave them with {previous}</Button>
            <Button onClick={() => save(true)} loading={update.isPending && update.variables?.moveShots === true}>Move them to {next}</Button>
          </>
        ) : (
          <><Button variant="secondary" onClick={onClose}>Cancel</Button><Button onClick={() => save()} loading={update.isPending}>Save</Button></>
        )
      }
    >
      {/* The dialog is narrow: the form's fields one under another at every width. */}
      <div className="max-h-[60vh] overflow-y-auto pr-1 [&_.sm\:grid-cols-2]:sm:grid-cols-1 [&_.lg\:grid-cols-3]:lg:grid-cols-1">
        {formError && <Alert tone="danger" className="mb-3">{formError}</Alert>}
        {moveAsk && (
          <Alert tone="warn" title="Move the clip's shots too?" className="mb-3">
            {moveAsk} Moved shots are seen by {next} and no longer by {previous}; shots left behind stay {previous}’s.
          </Alert>
        )}
        {options.data ? (
          <ClipMetaFields idPrefix={`edit-${clip.id}`} values={values} errors={errors} options={options.data} onChange={(p) => setValues((v) => ({ ...v, ...p }))} />
        ) : (
          <PageSpinner label="Loading players and sessions…" />
        )}
      </div>
    </Dialog>
  );
}
