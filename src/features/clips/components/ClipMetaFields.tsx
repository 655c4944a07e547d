import { Field, Input, Select, Textarea } from "@/components/ui";
import { cameraViewLabels, cameraViews, shotTypeLabels, shotTypes, type ClipOptions } from "@shared/schemas/clips";
import { sessionLabel } from "../format";
import type { MetaErrors, MetaFormValues } from "../upload/metaForm";

interface Props {
  values: MetaFormValues;
  errors: MetaErrors;
  options: ClipOptions;
  onChange: (patch: Partial<MetaFormValues>) => void;
  disabled?: boolean;
  /** Prefix for element ids, one per form on the page. */
  idPrefix: string;
  /** An image sequence: the capture rate is required and typing it confirms it. */
  sequence?: boolean;
}

/** The details of one clip: who shoots, when and where, the camera and, above all, its capture rate. */
export function ClipMetaFields({ values: v, errors: e, options, onChange, disabled, idPrefix, sequence }: Props) {
  const id = (name: string) => `${idPrefix}-${name}`;
  const text = (name: keyof MetaFormValues) => ({
    id: id(name), value: v[name] as string, disabled,
    onChange: (ev: { target: { value: string } }) => onChange({ [name]: ev.target.value } as Partial<MetaFormValues>),
  });
  const ownSticks = options.sticks.filter((s) => !v.playerId || s.ownerId === v.playerId || s.ownerId === null);
  const otherSticks = options.sticks.filter((s) => !ownSticks.includes(s));

  return (
    <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      <Field label="Player" required error={e.playerId}>
        <Select {...text("playerId")}>
          <option value="">Choose the player who shoots…</option>
          {options.players.map((p) => (
            <option key={p.id} value={p.id}>{p.name}</option>
          ))}
        </Select>
      </Field>
      <Field label="Shot type" required error={e.shotType}>
        <Select {...text("shotType")}>
          <option value="">Choose…</option>
          {shotTypes.map((t) => (
            <option key={t} value={t}>{shotTypeLabels[t]}</option>
          ))}
        </Select>
      </Field>
      <Field label="Camera view" required error={e.cameraView}>
        <Select {...text("cameraView")}>
          {cameraViews.map((c) => (
            <option key={c} value={c}>{cameraViewLabels[c]}</option>
          ))}
        </Select>
      </Field>

      <div className="col-span-full grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <Field label="Session" required error={e.session}>
          <Select {...text("session")}>
            <option value="new">New session…</option>
            {options.sessions.map((s) => (
              <option key={s.id} value={s.id}>{sessionLabel(s)}</option>
            ))}
          </Select>
        </Field>
        {v.session === "new" && (
          <>
            <Field label="Session date" required error={e.newDate}>
              <Input type="date" {...text("newDate")} />
            </Field>
            <Field label="Venue" error={e.newVenue}>
              <Input placeholder="e.g. Lakeport Arena, rink 2" {...text("newVenue")} />
            </Field>
            <Field label="Drill" error={e.newDrill}>
              <Input placeholder="e.g. Slap shots from the point" {...text("newDrill")} />
            </Field>
          </>
        )}
      </div>

      <Field
        label="Capture frame rate (fps)"
        required={sequence}
        error={e.captureFps}
        hint={
          sequence
            ? "Numbered frames carry no rate: type the rate the camera recorded at (e.g. 3,200). Each frame's time is its number ÷ this rate."
            : "The rate the camera recorded at, e.g. 3,200 for a lab camera or 240 for phone slow motion. Leave empty to decide once the file is checked."
        }
        className="sm:col-span-2 lg:col-span-1"
      >
        <Input inputMode="decimal" placeholder="e.g. 3200" {...text("captureFps")} />
      </Field>
      {!sequence && (
        <div className="flex items-start pt-7 sm:col-span-2 lg:col-span-2">
          <label className="flex items-start gap-2 text-sm text-ink">
            <input
              type="checkbox"
              className="mt-0.5 size-4 accent-[var(--color-accent)]"
              checked={v.captureFpsConfirmed}
              disabled={disabled || v.captureFps.trim() === ""}
              onChange={(ev) => onChange({ captureFpsConfirmed: ev.target.checked })}
            />
            <span>
              I confirm this is the capture rate
              <span className="block text-ink-muted">
                Files often store a playback rate (30 or 60 fps). Every speed is worked out from the capture rate, so only tick this when you know it.
              </span>
            </span>
          </label>
        </div>
      )}

      <Field label="Stick" error={e.stickId}>
        <Select {...text("stickId")}>
          <option value="">Not recorded</option>
          {ownSticks.map((s) => (
            <option key={s.id} value={s.id}>{s.label}</option>
          ))}
          {otherSticks.length > 0 && (
            <optgroup label="Other sticks">
              {otherSticks.map((s) => (
                <option key={s.id} value={s.id}>{s.label}</option>
              ))}
            </optgroup>
          )}
        </Select>
      </Field>
      <Field label="Exposure (µs)" error={e.exposureUs} hint="If known: 1/10,000 s is 100 µs.">
        <Input inputMode="decimal" placeholder="e.g. 100" {...text("exposureUs")} />
      </Field>
      <Field label="Title" error={e.title} hint="Empty: the file name.">
        <Input placeholder="e.g. Slap shot, side, take 3" {...text("title")} />
      </Field>
      <Field label="Notes" error={e.notes} className="sm:col-span-2 lg:col-span-3">
        <Textarea rows={2} placeholder="Lighting, camera distance, anything the analyst should know" {...text("notes")} />
      </Field>
    </div>
  );
}
