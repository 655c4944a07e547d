import { Link, useSearchParams } from "react-router-dom";
import { Alert, Card, EmptyState, PageHeader, PageSpinner, Select } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { formatDate } from "@/lib/format";
import { isStaff } from "@/lib/roles";
import { useActiveTeam, useSession } from "@/lib/session";
import { useUnits } from "@/lib/units";
import { METRICS, SHOT_TYPES, formatValue, shotTypeLabels, type ShotType } from "@shared/schemas/readout";
import { usePlayers } from "@/entities/member/players";
import { useProgress } from "../api/progress";
import { TrendCard } from "../components/TrendCard";

/** /progress?player=&stick=&type= — one player's results across sessions. */
export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, your progress shows here.</EmptyState>;
  return <Progress teamId={team.id} teamName={team.name} staff={isStaff(team.role)} />;
}

function Progress({ teamId, teamName, staff }: { teamId: string; teamName: string; staff: boolean }) {
  const me = useSession();
  const [search, setSearch] = useSearchParams();
  const players = usePlayers(teamId);
  const list = players.data?.players ?? [];
  const chosen = staff ? (search.get("player") ?? list.find((p) => p.shots > 0)?.id ?? list[0]?.id ?? "") : me.user.id;
  const stickId = search.get("stick") ?? undefined;
  // No type in the address: the server shows the player's most common; "all" shows every type.
  const shotType = (search.get("type") as ShotType | "all" | null) ?? undefined;
  const q = useProgress(teamId, { playerId: chosen, stickId, shotType }, !!chosen);
  const { system } = useUnits();
  const set = (k: string, v: string) => {
    const next = new URLSearchParams(search);
    if (v) next.set(k, v);
    else next.delete(k);
    if (k === "player") {
      next.delete("stick");
      next.delete("type");
    }
    setSearch(next, { replace: true });
  };

  const header = (
    <PageHeader
      eyebrow={teamName}
      title={staff ? "Progress" : "Your progress"}
      description="Results across sessions: each dot is a shot, the line is the typical (median) value of each session."
    />
  );
  if (players.isPending || (chosen && q.isPending)) return <>{header}<PageSpinner label="Loading progress…" /></>;
  if (players.isError || q.isError)
    return (
      <>
        {header}
        <Alert tone="danger" title="Couldn't load the progress">
          {errorMessage(players.error ?? q.error)}
        </Alert>
      </>
    );
  if (!chosen || !q.data)
    return (
      <>
        {header}
        <EmptyState title="No players yet">When players join the team and their shots are digitised, their progress shows here.</EmptyState>
      </>
    );
  const p = q.data;
  return (
    <>
      {header}
      <Card className="mb-6">
        <div className="flex flex-wrap items-end gap-4">
          {staff && (
            <label className="flex flex-col gap-1 text-sm font-medium">
              Player
              <Select compact value={chosen} onChange={(e) => set("player", e.target.value)} className="min-w-52">
                {list.map((x) => (
                  <option key={x.id} value={x.id}>
                    {x.name} ({x.shots} shot{x.shots === 1 ? "" : "s"})
                  </option>
                ))}
              </Select>
            </label>
          )}
          <label className="flex flex-col gap-1 text-sm font-medium">
            Stick
            <Select compact value={stickId ?? ""} onChange={(e) => set("stick", e.target.value)} className="min-w-44">
              <option value="">All sticks</option>
              {p.sticks.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.label}
                </option>
              ))}
            </Select>
          </label>
          <label className="flex flex-col gap-1 text-sm font-medium">
            Shot type
            <Select compact value={p.shotType ?? "all"} onChange={(e) => set("type", e.target.value)} className="min-w-40">
              <option value="all">All types</option>
              {SHOT_TYPES.filter((t) => p.shotTypes.includes(t)).map((t) => (
                <option key={t} value={t}>
                  {shotTypeLabels[t]} ({p.shotTypeCounts[t] ?? 0})
                </option>
              ))}
            </Select>
          </label>
          <p className="ml-auto text-sm text-ink-muted">
            {p.points.length} shot{p.points.length === 1 ? "" : "s"} with results
            {p.withoutResults > 0 && ` · ${p.withoutResults} still being digitised`}
          </p>
        </div>
      </Card>
      {p.points.length === 0 ? (
        <EmptyState title={`No results yet for ${p.player.name}`}>
          {p.withoutResults > 0
            ? `${p.withoutResults} of ${staff ? "their" : "your"} shots are still being digitised; the trend appears once they have results.`
            : staff
              ? "No shot of this player has been digitised yet: upload a clip in Clips, add a shot and digitise it."
              : "When your analyst digitises your shots, your trend shows here."}
        </EmptyState>
      ) : (
        <>
          <div className="grid gap-6 lg:grid-cols-2">
            {METRICS.map((m) => (
              <TrendCard key={m.key} def={m} points={p.points} summary={p.summary[m.key]} units={system} byType={p.shotType === null && new Set(p.points.map((x) => x.shotType)).size > 1} />
            ))}
          </div>
          <Card title="Shots in this view" className="mt-6" flush>
            <ul className="divide-y divide-line">
              {[...p.points].reverse().map((x) => (
                <li key={x.shotId} className="flex flex-wrap items-center justify-between gap-3 px-5 py-3 text-sm">
                  <Link to={`/readout/${x.shotId}`} className="font-medium text-ink hover:text-accent hover:underline">
                    {x.label || shotTypeLabels[x.shotType]} · {formatDate(x.date)}
                  </Link>
                  <span className="text-ink-muted">
                    {[x.stickLabel, x.venue].filter(Boolean).join(" · ")} · puck {formatValue("speed", x.values.puckExitSpeed?.value, system)}
                  </span>
                </li>
              ))}
            </ul>
          </Card>
        </>
      )}
    </>
  );
}
