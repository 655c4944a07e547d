import { useState } from "react";
import { Alert, Button, EmptyState, PageHeader, PageSpinner, LoadError } from "@/components/ui";
import { useActiveTeam } from "@/lib/session";
import { useSticks } from "../api/sticks";
import { AlertLevelCard } from "../components/AlertLevelCard";
import { StickCard } from "../components/StickCard";
import { StickFormDialog } from "../components/StickFormDialog";

export function Component() {
  const team = useActiveTeam();
  if (!team) return <EmptyState title="No team yet">When a team admin invites you, your team's sticks show here.</EmptyState>;
  return <Sticks teamId={team.id} teamName={team.name} />;
}

function Sticks({ teamId, teamName }: { teamId: string; teamName: string }) {
  const sticks = useSticks(teamId);
  const [adding, setAdding] = useState(false);
  const data = sticks.data;
  const below = data?.sticks.filter((s) => s.belowAlert) ?? [];

  return (
    <>
      <PageHeader
        eyebrow={teamName}
        title="Stick lab"
        description={
          data && !data.canEdit
            ? "Your sticks: what each was rated, what it measures on the bench now, and how it has changed."
            : "Every stick with its rated flex and what it measures on the bench now. Open one for its stiffness history, a new bench test or the beam model."
        }
        actions={data?.canEdit && <Button onClick={() => setAdding(true)}>Add stick</Button>}
      />
      {sticks.isPending ? (
        <PageSpinner label="Loading sticks…" />
      ) : sticks.isError ? (
        <LoadError title="Couldn't load the sticks" error={sticks.error} onRetry={() => sticks.refetch()} />
      ) : (
        <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
          <div className="flex min-w-0 flex-col gap-4">
            {below.length > 0 && (
              <Alert tone="warn" title={`${below.length} stick${below.length === 1 ? " measures" : "s measure"} below ${data!.flexAlertPercent} % of the rating`}>
                {below.map((s) => s.label).join(", ")}: softer than the team's alert level. Re-test, and check whether the player still wants that flex.
              </Alert>
            )}
            {data!.sticks.length === 0 ? (
              <EmptyState
                title={data!.canEdit ? "No sticks yet" : "No sticks in your name yet"}
                action={data!.canEdit && <Button onClick={() => setAdding(true)}>Add the first stick</Button>}
              >
                {data!.canEdit ? "Add a stick with its rated flex, then bench-test it to see what it really measures." : "When your coach adds a stick for you, it shows here with its bench tests."}
              </EmptyState>
            ) : (
              <ul className="grid gap-4 sm:grid-cols-2">
                {[...data!.sticks].sort((a, b) => Number(b.belowAlert) - Number(a.belowAlert) || a.label.localeCompare(b.label)).map((s) => (
                  <li key={s.id}>
                    <StickCard stick={s} alertPercent={data!.flexAlertPercent} />
                  </li>
                ))}
              </ul>
            )}
          </div>
          <aside className="flex flex-col gap-4">
            {data!.canManageSettings && <AlertLevelCard teamId={teamId} current={data!.flexAlertPercent} />}
            <HowFlexWorks />
          </aside>
        </div>
      )}
      {data?.canEdit && <StickFormDialog teamId={teamId} open={adding} onClose={() => setAdding(false)} players={data.players} />}
    </>
  );
}

function HowFlexWorks() {
  return (
    <div className="rounded-[var(--radius-card)] border border-line bg-sunken/50 p-5 text-sm text-ink-muted">
      <h2 className="mb-1.5 font-semibold text-ink">What the flex number means</h2>
      <p>
        A stick's flex is the load in pounds that bends the shaft one inch when it rests on two supports 1 m apart and is pushed at the middle. An 85 flex
        needs 85 lbf. Used sticks measure softer than their printed number.
      </p>
    </div>
  );
}
