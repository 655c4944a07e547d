import { useLocation, useNavigate } from "react-router-dom";
import { Badge, Menu, MenuItem, MenuLabel, Spinner, toast } from "@/components/ui";
import { roleLabel } from "@/lib/roles";
import { useSession, useSetActiveTeam } from "@/lib/session";

/** Shows the active team and the person's role in it; switching reloads every team-scoped view. */
export function TeamSwitcher() {
  const me = useSession();
  const setActive = useSetActiveTeam();
  const navigate = useNavigate();
  const { pathname } = useLocation();
  const active = me.teams.find((t) => t.id === me.activeTeamId) ?? me.teams[0];

  if (!active) return <span className="text-sm text-ink-muted">No team yet</span>;

  const choose = (teamId: string) => {
    if (teamId === active.id) return;
    setActive.mutate(teamId, {
      onSuccess: (next) => {
        const team = next.teams.find((t) => t.id === teamId);
        toast.success(`You're now working in ${team?.name ?? "the other team"}.`, "Team switched");
        // A record's page (e.g. /clips/123) belonged to the old team: go back to its area.
        const area = "/" + (pathname.split("/")[1] ?? "");
        if (area !== pathname) navigate(area);
      },
    });
  };

  return (
    <Menu
      className="min-w-0"
      triggerClassName="flex h-10 min-w-0 max-w-72 items-center gap-2.5 rounded-lg border border-line bg-surface pr-2.5 pl-3 text-left hover:border-line-strong hover:bg-sunken/60"
      trigger={
        <>
          {/* The button's name is its visible text plus hidden words: "Team: <team>, <role>. Switch team". */}
          <span className="min-w-0 leading-tight">
            <span className="block truncate text-sm font-semibold text-ink">
              <span className="sr-only">Team: </span>
              {active.name}
              <span className="sr-only">,</span>
            </span>
            <span className="block text-xs text-ink-muted">
              {roleLabel[active.role]}
              <span className="sr-only">. Switch team</span>
            </span>
          </span>
          {setActive.isPending ? (
            <Spinner size="sm" label="Switching team…" />
          ) : (
            <svg aria-hidden viewBox="0 0 16 16" className="size-4 shrink-0 text-ink-muted">
              <path d="M5 6.5 8 3.5l3 3M5 9.5l3 3 3-3" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
            </svg>
          )}
        </>
      }
    >
      <MenuLabel>Your teams</MenuLabel>
      {me.teams.map((t) => (
        <MenuItem key={t.id} checked={t.id === active.id} onSelect={() => choose(t.id)}>
          <span className="flex items-center justify-between gap-3">
            <span className="truncate font-medium">{t.name}</span>
            <Badge tone={t.role === "admin" ? "accent" : "neutral"}>{roleLabel[t.role]}</Badge>
          </span>
        </MenuItem>
      ))}
      <p className="mx-3 mt-1.5 mb-1 border-t border-line pt-2 text-xs text-ink-muted">Each team's clips, shots and sticks stay inside that team.</p>
    </Menu>
  );
}
