import { auth } from "../auth/auth";
import type { SignedIn } from "../auth/context";
import { HttpError, notFound } from "../http/problem";
import { isDatabaseDown } from "../http/database-down";
import { parseRole, type MeResponse, type Prefs } from "../../shared/schemas/roster";
import { getPrefs, savePrefs } from "../entities/user/prefs";
import { teamsOf } from "../entities/member/repository";

export async function me(s: SignedIn): Promise<MeResponse> {
  const rows = await teamsOf(s.user.id);
  // A team whose stored role is unknown opens nothing (roleIn), so it is not offered either.
  const teams = rows.flatMap((t) => {
    const role = parseRole(t.role);
    return role ? [{ ...t, role }] : [];
  });
  const active = teams.find((t) => t.id === s.activeTeamId)?.id ?? teams[0]?.id ?? null;
  return { user: s.user, prefs: await getPrefs(s.user.id), teams, activeTeamId: active };
}

/** Switches the session's team; returns the answer and the refreshed session cookies to set. */
export async function setActiveTeam(s: SignedIn, headers: Headers, teamId: string): Promise<{ me: MeResponse; setCookies: string[] }> {
  const teams = await teamsOf(s.user.id);
  if (!teams.some((t) => t.id === teamId)) throw notFound("That team");
  let setCookies: string[];
  try {
    setCookies = (await auth().api.setActiveOrganization({ headers, body: { organizationId: teamId }, returnHeaders: true })).headers.getSetCookie();
  } catch (e) {
    if (isDatabaseDown(e)) throw e;
    throw new HttpError(409, "switch_failed", `Could not switch team: ${(e as Error).message}`);
  }
  return { me: await me({ ...s, activeTeamId: teamId }), setCookies };
}

export const updatePrefs = (s: SignedIn, patch: Partial<Prefs>) => savePrefs(s.user.id, patch);
