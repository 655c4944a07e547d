import { useForm } from "react-hook-form";
import type { PersonRef, StickRow } from "@shared/schemas/sticks";
import { Button, Dialog, Field, Input, Select, Textarea, toast } from "@/components/ui";
import { applyServerErrors, FormError } from "@/lib/forms";
import { useUnits } from "@/lib/units";
import { useSaveStick } from "../api/saveStick";
import { lengthFromMm, lengthToMm } from "../lib/bench-units";

interface Values {
  label: string;
  ownerId: string;
  ratedFlex: string;
  lengthMm: string;
  bladeCurve: string;
  lie: string;
  firstUseDate: string;
  notes: string;
}

interface Props {
  teamId: string;
  open: boolean;
  onClose: () => void;
  players: PersonRef[];
  /** Editing this stick; a new one when absent. */
  stick?: StickRow;
  onSaved?: (s: StickRow) => void;
}

const numberOrNull = (s: string) => (s.trim() === "" ? null : Number(s));

export function StickFormDialog({ teamId, open, onClose, players, stick, onSaved }: Props) {
  const { system, unit } = useUnits();
  const save = useSaveStick(teamId, stick?.id);
  const form = useForm<Values>({
    values: {
      label: stick?.label ?? "",
      ownerId: stick?.owner?.id ?? "",
      ratedFlex: stick?.ratedFlex?.toString() ?? "",
      lengthMm: stick?.lengthMm ? String(Math.round(lengthFromMm(system, stick.lengthMm) * 10) / 10) : "",
      bladeCurve: stick?.bladeCurve ?? "",
      lie: stick?.lie ?? "",
      firstUseDate: stick?.firstUseDate ?? "",
      notes: stick?.notes ?? "",
    },
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((v) => {
    const length = numberOrNull(v.lengthMm);
    return save
      .mutateAsync({
        label: v.label,
        ownerId: v.ownerId || null,
        ratedFlex: numberOrNull(v.ratedFlex),
        lengthMm: length === null ? null : lengthToMm(system, length),
        bladeCurve: v.bladeCurve,
        lie: v.lie,
        firstUseDate: v.firstUseDate || null,
        notes: v.notes,
      })
      .then(
        (saved) => {
          toast.success(`${saved.label} is saved.`, stick ? "Stick updated" : "Stick added");
          onSaved?.(saved);
          onClose();
        },
        (e) => applyServerErrors(form, e),
      );
  });

  return (
    <Dialog open={open} onClose={onClose} title={stick ? `Edit ${stick.label}` : "Add a stick"} description="Rated flex is the number printed on the shaft.">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <FormError form={form} />
        <Field label="Label" required error={errors.label?.message} hint="How the team tells this stick apart, e.g. “Theo's gamer”.">
          <Input autoFocus {...form.register("label", { required: "Give the stick a label" })} />
        </Field>
        <Field label="Owner" error={errors.ownerId?.message}>
          <Select {...form.register("ownerId")}>
            <option value="">No owner (team stick)</option>
            {players.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </Select>
        </Field>
        <div className="grid grid-cols-2 gap-4">
          <Field label="Rated flex" error={errors.ratedFlex?.message}>
            <Input type="number" inputMode="decimal" step="any" placeholder="85" {...form.register("ratedFlex")} />
          </Field>
          <Field label={`Length (${unit("length")})`} error={errors.lengthMm?.message}>
            <Input type="number" inputMode="decimal" step="any" {...form.register("lengthMm")} />
          </Field>
          <Field label="Blade curve" error={errors.bladeCurve?.message}>
            <Input placeholder="mid-heel, open" {...form.register("bladeCurve")} />
          </Field>
          <Field label="Lie" error={errors.lie?.message}>
            <Input placeholder="5.5" {...form.register("lie")} />
          </Field>
        </div>
        <Field label="First used on" error={errors.firstUseDate?.message}>
          <Input type="date" {...form.register("firstUseDate")} />
        </Field>
        <Field label="Notes" error={errors.notes?.message}>
          <Textarea rows={3} {...form.register("notes")} />
        </Field>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" loading={save.isPending}>
            {stick ? "Save changes" : "Add stick"}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
