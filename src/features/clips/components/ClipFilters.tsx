import { Select } from "@/components/ui";
import { clipStatusLabels, clipStatuses, shotTypeLabels, shotTypes, type ClipOptions } from "@shared/schemas/clips";
import { sessionLabel } from "../format";

export interface FilterValues { playerId?: string; sessionId?: string; shotType?: string; status?: string }

/** Filters applied on the server; players (who see only their own clips) get no player or session list. */
export function ClipFilters({ values, options, onChange }: { values: FilterValues; options?: ClipOptions; onChange: (patch: FilterValues) => void }) {
  const select = (key: keyof FilterValues, label: string, items: { value: string; label: string }[], width = "w-44") => (
    <label className="flex flex-col gap-1 text-xs font-medium text-ink-muted">
      {label}
      <Select compact className={width} value={values[key] ?? ""} onChange={(e) => onChange({ [key]: e.target.value || undefined })}>
        <option value="">All</option>
        {items.map((i) => (
          <option key={i.value} value={i.value}>{i.label}</option>
        ))}
      </Select>
    </label>
  );
  return (
    <div className="flex flex-wrap items-end gap-3" role="group" aria-label="Filter clips">
      {options && select("playerId", "Player", options.players.map((p) => ({ value: p.id, label: p.name })))}
      {options && select("sessionId", "Session", options.sessions.map((s) => ({ value: s.id, label: sessionLabel(s) })), "w-72")}
      {select("shotType", "Shot type", shotTypes.map((t) => ({ value: t, label: shotTypeLabels[t] })))}
      {select("status", "Status", clipStatuses.filter((s) => s !== "uploading" && s !== "probing").map((s) => ({ value: s, label: clipStatusLabels[s] })))}
    </div>
  );
}
