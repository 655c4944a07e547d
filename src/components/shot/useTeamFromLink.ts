import { useEffect, useRef } from "react";
import { useSearchParams } from "react-router-dom";
import { useActiveTeam, useSession, useSetActiveTeam } from "@/lib/session";

/**
 * Links in e-mails and reports carry `?team=<id>`: when it names another of the person's teams,
 * switch to it first, so the shot is looked up in the team it belongs to. Returns true while
 * switching (the page should wait); a team the person is not in is ignored (the page then says
 * the shot was not found).
 */
export function useTeamFromLink(): boolean {
  const [search] = useSearchParams();
  const wanted = search.get("team");
  const me = useSession();
  const active = useActiveTeam();
  const switchTeam = useSetActiveTeam();
  const tried = useRef<string | null>(null);
  const needs = !!wanted && wanted !== active?.id && me.teams.some((t) => t.id === wanted);
  useEffect(() => {
    if (needs && tried.current !== wanted) {
      tried.current = wanted;
      switchTeam.mutate(wanted!);
    }
  }, [needs, wanted, switchTeam]);
  return needs && !switchTeam.isError;
}
