import { Alert, Card, PageHeader } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { cn } from "@/lib/cn";
import { useSession, useUpdatePrefs, type Prefs } from "@/lib/session";
import { formatValue } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";

// The person's own settings: units (the same choice as in the account menu) and which e-mails they get.

const unitChoices: { value: UnitSystem; label: string }[] = [
  { value: "metric", label: "Metric" },
  { value: "imperial", label: "Imperial" },
];

const mails: { key: "notifyClipReady" | "notifyShotShared"; label: string; hint: string }[] = [
  { key: "notifyClipReady", label: "A clip I uploaded is ready, or could not be processed", hint: "Sent when the frames of your upload are ready to digitise, or when extraction failed and why." },
  { key: "notifyShotShared", label: "A coach shares a shot with me", hint: "With a link to the shot's readout and its puck exit speed in your units." },
];

/** Example values in both systems, so the choice is concrete: 30 m/s, 40 mm, 5 J. */
const example = (u: UnitSystem) => [formatValue("speed", 30, u), formatValue("length", 40, u), formatValue("energy", 5, u)].join(" · ");

export function Component() {
  const me = useSession();
  const update = useUpdatePrefs();
  const save = (patch: Partial<Prefs>) => update.mutate(patch);
  return (
    <>
      <PageHeader title="Settings" description="Your own choices; they follow you into every team, screen, export and e-mail." />
      <div className="grid max-w-3xl gap-6">
        {update.isError && <Alert tone="danger" title="Couldn't save that">{errorMessage(update.error)}</Alert>}
        <Card title="Units" description="How speeds, lengths, forces and energies are shown to you. Everything is stored in SI.">
          <div role="radiogroup" aria-label="Units" className="grid gap-3 sm:grid-cols-2">
            {unitChoices.map((u) => {
              const on = me.prefs.units === u.value;
              return (
                <button
                  key={u.value}
                  type="button"
                  role="radio"
                  aria-checked={on}
                  onClick={() => !on && save({ units: u.value })}
                  className={cn(
                    "rounded-lg border-2 px-4 py-3 text-left transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent",
                    on ? "border-accent bg-accent-soft" : "border-line hover:border-line-strong",
                  )}
                >
                  <span className="block font-semibold text-ink">{u.label}</span>
                  <span className="block text-sm text-ink-muted">{example(u.value)}</span>
                </button>
              );
            })}
          </div>
        </Card>
        <Card title="E-mail notifications" description={`Sent to ${me.user.email}. Turn off any kind you do not want.`}>
          <ul className="divide-y divide-line">
            {mails.map((m) => (
              <li key={m.key} className="flex items-start justify-between gap-4 py-3 first:pt-0 last:pb-0">
                <label htmlFor={m.key} className="min-w-0">
                  <span className="block font-medium text-ink">{m.label}</span>
                  <span className="block text-sm text-ink-muted">{m.hint}</span>
                </label>
                <input
                  id={m.key}
                  type="checkbox"
                  role="switch"
                  className="mt-1 size-5 shrink-0 accent-accent"
                  checked={me.prefs[m.key]}
                  onChange={(e) => save({ [m.key]: e.target.checked })}
                />
              </li>
            ))}
          </ul>
        </Card>
      </div>
    </>
  );
}
