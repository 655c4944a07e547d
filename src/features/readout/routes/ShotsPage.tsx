import { useState } from "react";
import { useNavigate, useSearchParams } from "react-router-dom";
import { Button, ButtonLink, Card, EmptyState, PageHeader, PageSpinner, Pager, Select, LoadError } from "@/components/ui";
import { isStaff } from "@/lib/roles";
import { useActiveTeam } from "@/lib/session";
import { useUnits } from "@/lib/units";
import { SHOT_TYPES, shotTypeLabels, type ShotType } from "@shared/schemas/readout";
import { useShots } from "@/entities/shot";
import { ReviewSetting } from "../components/ReviewSetting";
import { ShotsTable } from "../components/ShotsTable";

const PAGE_SIZE = 50;

/** /readout — the shots one may see (staff: the team's; a player: own and shared), to open or compare. */
export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, your team's shots show here.</EmptyState>;
  return <Shots teamId={team.id} teamName={team.name} staff={isStaff(team.role)} admin={team.role === "admin"} />;
}

const REVIEW = { waiting: "Waiting for review", published: "Published" } as const;

function Shots({ teamId, teamName, staff, admin }: { teamId: string; teamName: string; staff: boolean; admin: boolean }) {
  // Filters and page live in the address, so a filtered page can be reloaded or sent on.
  const [params, setParams] = useSearchParams();
  const player = params.get("player") ?? "";
  const stick = params.get("stick") ?? "";
  const type = (SHOT_TYPES as readonly string[]).includes(params.get("type") ?? "") ? (params.get("type") as ShotType) : "";
  const review = staff && (params.get("review") === "waiting" || params.get("review") === "published") ? (params.get("review") as keyof typeof REVIEW) : "";
  const page = Math.max(1, Number(params.get("page")) || 1);
  const update = (patch: Record<string, string>) =>
    setParams((p) => {
      const next = new URLSearchParams(p);
      for (const [k, v] of Object.entries(patch)) if (v) next.set(k, v);
      else next.delete(k);
      if (!("page" in patch)) next.delete("page");
      return next;
    });
  const filtered = !!(player || stick || type || review);
  const q = useShots(teamId, { playerId: player || undefined, stickId: stick || undefined, shotType: type || undefined, review: review || undefined, page, pageSize: PAGE_SIZE });
  const { system } = useUnits();
  const navigate = useNavigate();
  const [selected, setSelected] = useState<string[]>([]);
  const shots = q.data?.shots ?? [];
  const toggle = (id: string) => setSelected((s) => (s.includes(id) ? s.filter((x) => x !== id) : [...s, id].slice(-2)));

  const header = (
    <PageHeader
      eyebrow={teamName}
      title="Shots"
      description={staff ? "Every digitised shot of the team. Open one for its readout, or tick two to put them side by side." : "Your shots and the ones your coaches shared with you. Open one for its readout, or tick two to compare them."}
      actions={
        <Button disabled={selected.length !== 2} onClick={() => navigate(`/compare?a=${selected[0]}&b=${selected[1]}`)}>
          {selected.length === 2 ? "Compare the two ticked" : `Tick two shots to compare (${selected.length}/2)`}
        </Button>
      }
    />
  );
  if (q.isPending) return <>{header}<PageSpinner label="Loading shots…" /></>;
  if (q.isError)
    return (
      <>
        {header}
        <LoadError title="Couldn't load the shots" error={q.error} onRetry={() => q.refetch()} />
      </>
    );
  if (!q.data.total && !filtered)
    return (
      <>
        {header}
        <EmptyState title="No shots yet" action={staff ? <ButtonLink variant="primary" to="/clips">Go to Clips</ButtonLink> : undefined}>
          {staff
            ? "To get the first shot: upload a high-frame-rate clip in Clips, wait until its frames are ready, then add a shot to it and digitise the puck, blade and hands with the events. Its readout appears here."
            : "When your analyst digitises one of your shots, or a coach shares a shot with you, it shows here with its readout."}
        </EmptyState>
      </>
    );

  return (
    <>
      {header}
      {staff && <ReviewSetting teamId={teamId} canChange={admin} />}
      <Card flush>
        <div className="flex flex-wrap items-end gap-3 border-b border-line px-5 py-4">
          {staff && (
            <Filter label="Player" value={player} onChange={(v) => update({ player: v })} options={q.data.players.map((p) => [p.id, p.name])} all="All players" />
          )}
          <Filter label="Stick" value={stick} onChange={(v) => update({ stick: v })} options={q.data.sticks.map((s) => [s.id, s.label])} all="All sticks" />
          <Filter label="Shot type" value={type} onChange={(v) => update({ type: v })} options={SHOT_TYPES.map((t) => [t, shotTypeLabels[t]])} all="All types" />
          {staff && <Filter label="Review" value={review} onChange={(v) => update({ review: v })} options={Object.entries(REVIEW)} all="Any" />}
          <p className="ml-auto text-sm text-ink-muted">
            {q.data.total.toLocaleString("en")} shot{q.data.total === 1 ? "" : "s"}
            {filtered ? " match" : ""}
          </p>
        </div>
        {shots.length ? (
          <>
            <ShotsTable shots={shots} units={system} showPlayer={staff} selected={selected} onToggle={toggle} />
            {q.data.total > q.data.pageSize && <Pager page={q.data.page} pageSize={q.data.pageSize} total={q.data.total} onPage={(p) => update({ page: String(p) })} noun="shots" />}
          </>
        ) : (
          <p className="px-5 py-8 text-center text-sm text-ink-muted">No shot matches these filters.</p>
        )}
      </Card>
    </>
  );
}

function Filter({ label, value, onChange, options, all }: { label: string; value: string; onChange: (v: string) => void; options: [string, string][]; all: string }) {
  return (
    <label className="flex flex-col gap-1 text-sm font-medium text-ink">
      {label}
      <Select compact value={value} onChange={(e) => onChange(e.target.value)} className="min-w-44">
        <option value="">{all}</option>
        {options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </Select>
    </label>
  );
}
