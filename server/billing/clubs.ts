// Clubs and the teams they own: finding a team's club (making one for a team that has none) and
// adding a team to a club. Used by billing, by the plan limits and by the new club's sign-up.
import { randomBytes } from "node:crypto";
import { FREE_PLAN, type PlanId } from "../../shared/billing/plans";
import * as repo from "../entities/club/repository";
import { teamName } from "../entities/team/repository";

/** The team's club; a team made outside any club gets a club of its own on the free plan. */
export async function clubFor(teamId: string): Promise<repo.ClubRow> {
  const found = await repo.clubOfTeam(teamId);
  if (found) return found;
  const made = await repo.createClub({ name: (await teamName(teamId)) ?? "Club", plan: FREE_PLAN });
  await repo.addTeamToClub(made.id, teamId);
  const mine = await repo.clubOfTeam(teamId);
  // Two requests raced: keep the club that won, drop ours.
  if (mine && mine.id !== made.id) await repo.deleteClub(made.id);
  return mine ?? made;
}

const slugOf = (name: string) =>
  `${name.toLowerCase().normalize("NFKD").replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 40) || "team"}-${randomBytes(3).toString("hex")}`;

/** A new team in the club with `adminId` as its team admin, inside `tx` (or a transaction of its own). */
export async function createTeamInClub(clubId: string, name: string, adminId: string, tx?: repo.Tx): Promise<{ id: string; name: string }> {
  if (!tx) return repo.inTransaction((t) => createTeamInClub(clubId, name, adminId, t));
  const id = await repo.insertTeamWithAdmin(tx, { name, slug: slugOf(name), adminId });
  await repo.addTeamToClub(clubId, id, tx);
  return { id, name };
}

/** A new club on the free plan with its first team, `adminId` its team admin. */
export async function createClubWithTeam(p: { clubName: string; teamName: string; adminId: string; plan?: PlanId }) {
  const c = await repo.createClub({ name: p.clubName, plan: p.plan ?? FREE_PLAN });
  const team = await createTeamInClub(c.id, p.teamName, p.adminId);
  return { club: c, team };
}
