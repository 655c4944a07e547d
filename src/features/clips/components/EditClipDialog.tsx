import { useState } from "react";
import { Alert, Button, Dialog, PageSpinner, toast } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";
import type { ClipDetail } from "@shared/schemas/clips";
import { useClipOptions } from "../api/clipOptions";
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

  const save = () => {
    const checked = validateMeta(values);
    if (!checked.meta) return setErrors(checked.errors);
    const { captureFps, ...m } = checked.meta;
    update.mutate(
      { ...m, stickId: m.stickId ?? null, exposureUs: m.exposureUs ?? null, ...(captureFps !== undefined ? { captureFps } : {}) },
      {
        onSuccess: () => {
          toast.success("The clip's details are saved.", "Saved");
          onClose();
        },
        onError: (e) => {
          if (isApiError(e) && e.errors.length) setErrors(errorsFrom(e.errors));
          else setFormError(errorMessage(e));
        },
      },
    );
  };

  return (
    <Dialog open={open} onClose={onClose} title="Clip details" footer={<><Button variant="secondary" onClick={onClose}>Cancel</Button><Button onClick={save} loading={update.isPending}>Save</Button></>}>
      <div className="max-h-[60vh] overflow-y-auto pr-1 [&_.lg\:grid-cols-3]:lg:grid-cols-2">
        {formError && <Alert tone="danger" className="mb-3">{formError}</Alert>}
        {options.data ? (
          <ClipMetaFields idPrefix={`edit-${clip.id}`} values={values} errors={errors} options={options.data} onChange={(p) => setValues((v) => ({ ...v, ...p }))} />
        ) : (
          <PageSpinner label="Loading players and sessions…" />
        )}
      </div>
    </Dialog>
  );
}
