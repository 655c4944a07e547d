// The plan's limits where the product meets them: storage (asked by the upload endpoint before any
// byte arrives), staff seats (asked by the roster before an invitation or a role change) and teams
// per club. At a limit the answer names the plan and the usage; nothing already stored is touched.
import { HttpError } from "../http/problem";
import { PLANS, storageText, type Plan } from "../../shared/billing/plans";
import { clubFor } from "./clubs";
import * as repo from "../entities/club/repository";
import { withNamedLock } from "../db/named-lock";

/** The storage a team's club may use and which teams share it. */
export async function storageAllowance(teamId: string): Promise<{ plan: Plan; clubName: string; limitBytes: number; teamIds: string[] }> {
  const club = await clubFor(teamId);
  const plan = PLANS[club.plan];
  const teamIds = (await repo.teamsOfClub(club.id)).map((t) => t.id);
  return { plan, clubName: club.name, limitBytes: plan.storageBytes, teamIds };
}

export function storageRefusal(a: { plan: Plan; clubName: string; limitBytes: number }, size: number, used: number) {
  return `This upload (${storageText(size)}) would take ${a.clubName} over the ${a.plan.name} plan's storage: ${storageText(used)} of ${storageText(a.limitBytes)} are in use. `
    + "Nothing stored was touched. Delete clips you no longer need, or a team admin can choose a larger plan under Billing.";
}

const STAFF = new Set(["admin", "coach", "analyst"]);

/**
 * Runs a change that may take a staff seat under the club's seat lock, so two invitations or role
 * changes at once cannot both see the last seat free (the seat check must run inside `fn`).
 */
export async function withSeatLock<T>(teamId: string, fn: () => Promise<T>): Promise<T> {
  const club = await clubFor(teamId);
  return withNamedLock(`staff-seats:${club.id}`, fn);
}

/** How many of the club's staff seats are taken, for the team admin's home. */
export async function staffSeatUse(teamId: string): Promise<{ used: number; seats: number; planName: string; clubName: string }> {
  const club = await clubFor(teamId);
  const plan = PLANS[club.plan];
  return { used: (await repo.staffEmailsOfClub(club.id)).size, seats: plan.staffSeats, planName: plan.name, clubName: club.name };
}

/** Refuses a staff role for `email` in the team when the club's plan has no seat left for a new person. */
export async function assertStaffSeat(teamId: string, email: string, role: string) {
  if (!STAFF.has(role)) return;
  const club = await clubFor(teamId);
  const plan = PLANS[club.plan];
  const staff = await repo.staffEmailsOfClub(club.id);
  if (staff.has(email.toLowerCase())) return; // already holds a seat in the club
  if (staff.size >= plan.staffSeats)
    throw new HttpError(409, "plan_limit",
      `The ${plan.name} plan has ${plan.staffSeats} staff seats (team admins, coaches and analysts) and ${club.name} uses all ${staff.size}. `
      + "Invite as a player, free a seat, or a team admin can choose a larger plan under Billing.");
}

export async function assertTeamRoom(club: repo.ClubRow) {
  const plan = PLANS[club.plan];
  const teams = await repo.teamsOfClub(club.id);
  if (teams.length >= plan.teams)
    throw new HttpError(409, "plan_limit",
      `The ${plan.name} plan has room for ${plan.teams === 1 ? "one team" : `${plan.teams} teams`} and ${club.name} has ${teams.length}. Choose a larger plan to add another.`);
}
