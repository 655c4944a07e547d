import { useState } from "react";
import { Button, Card, Field, Select } from "@/components/ui";
import { formatDate } from "@/lib/format";
import { formatValue, shotTitle, type ShotListItem } from "@shared/schemas/readout";
import type { UnitSystem } from "@shared/units";
import { shotColors } from "@/components/shot/colors";

interface Props {
  shots: ShotListItem[];
  a: string;
  b: string;
  units: UnitSystem;
  /** Staff group the choices by player; a player sees own shots first, then shared ones. */
  staff: boolean;
  onCompare: (a: string, b: string) => void;
}

function optionText(s: ShotListItem, units: UnitSystem) {
  const t = shotTitle({ ...s, playerName: null });
  return `${t} · ${formatDate(s.date)}${s.hasResults ? ` · ${formatValue("speed", s.puckExitSpeedMps, units)}` : " · no results yet"}`;
}

function groups(shots: ShotListItem[], staff: boolean): [string, ShotListItem[]][] {
  const by = new Map<string, ShotListItem[]>();
  for (const s of shots) {
    const g = staff ? (s.playerName ?? "No player") : s.sharedWithMe ? "Shared with you" : "Your shots";
    by.set(g, [...(by.get(g) ?? []), s]);
  }
  return [...by].sort(([x], [y]) => (x === "Your shots" ? -1 : y === "Your shots" ? 1 : x.localeCompare(y)));
}

export function ShotPicker({ shots, a, b, units, staff, onCompare }: Props) {
  const [pa, setPa] = useState(a);
  const [pb, setPb] = useState(b);
  const g = groups(shots, staff);
  const choose = (value: string, set: (v: string) => void, label: string, color: string, other: string) => (
    <Field label={<span className="flex items-center gap-2"><span aria-hidden className="size-3 rounded-full" style={{ background: color }} />{label}</span>}>
      <Select value={value} onChange={(e) => set(e.target.value)}>
        <option value="">Choose a shot…</option>
        {g.map(([name, list]) => (
          <optgroup key={name} label={name}>
            {list.map((s) => (
              <option key={s.id} value={s.id} disabled={s.id === other}>
                {optionText(s, units)}
              </option>
            ))}
          </optgroup>
        ))}
      </Select>
    </Field>
  );
  return (
    <Card title="Choose two shots" description={staff ? "Any two shots of the team." : "Two of your shots (or shots a coach shared with you)."}>
      <form
        className="grid items-end gap-4 md:grid-cols-[1fr_1fr_auto]"
        onSubmit={(e) => {
          e.preventDefault();
          if (pa && pb && pa !== pb) onCompare(pa, pb);
        }}
      >
        {choose(pa, setPa, "Shot A", shotColors.a, pb)}
        {choose(pb, setPb, "Shot B", shotColors.b, pa)}
        <Button type="submit" disabled={!pa || !pb || pa === pb}>
          Put side by side
        </Button>
      </form>
    </Card>
  );
}
