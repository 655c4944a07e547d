// The only Drizzle code of billing: clubs, the teams they own, applied webhook events.
import { and, eq, inArray, sql } from "drizzle-orm";
import { db, type Db } from "../../db/client";
import { prepared } from "../../db/prepared";
import { auditLog, billingEvent, club, clubTeam, invitation, member, organization, user } from "../../db/schema";
import type { PlanId } from "../../../shared/billing/plans";

export type ClubRow = typeof club.$inferSelect;
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

const clubOfTeamQuery = prepared("club_of_team", (name) =>
  db().select({ club }).from(clubTeam).innerJoin(club, eq(club.id, clubTeam.clubId)).where(eq(clubTeam.teamId, sql.placeholder("teamId"))).prepare(name),
);

/** The club a team belongs to (null for a team made outside any club). */
export async function clubOfTeam(teamId: string): Promise<ClubRow | null> {
  const [row] = await clubOfTeamQuery().execute({ teamId });
  return row?.club ?? null;
}

export async function clubById(id: string, tx: Tx | Db = db()) {
  const [row] = await tx.select().from(club).where(eq(club.id, id));
  return row ?? null;
}

export async function clubByCustomer(customerId: string) {
  const [row] = await db().select().from(club).where(eq(club.customerId, customerId));
  return row ?? null;
}

export async function teamsOfClub(clubId: string) {
  return db().select({ id: organization.id, name: organization.name }).from(clubTeam)
    .innerJoin(organization, eq(organization.id, clubTeam.teamId)).where(eq(clubTeam.clubId, clubId)).orderBy(organization.createdAt);
}

export async function createClub(v: { name: string; plan?: PlanId }, tx: Tx | Db = db()) {
  const [row] = await tx.insert(club).values(v).returning();
  return row!;
}

export async function addTeamToClub(clubId: string, teamId: string, tx: Tx | Db = db()) {
  await tx.insert(clubTeam).values({ clubId, teamId }).onConflictDoNothing();
}

/**
 * Clubs whose grace ran out by the clock alone (still past due, no service event since): their
 * read-only state has not been announced yet when no "billing.read_only" entry follows the
 * failed renewal in the audit log.
 */
export async function clubsPastGraceUnannounced(graceDays: number, tx: Tx | Db = db()) {
  return tx.select({ id: club.id }).from(club).where(and(
    eq(club.subscriptionStatus, "past_due"),
    sql`${club.pastDueSince} + make_interval(days => ${graceDays}) <= now()`,
    sql`not exists (select 1 from ${auditLog} a where a.action = 'billing.read_only' and a.target_type = 'club'
          and a.target_id = ${club.id}::text and a.created_at >= ${club.pastDueSince})`,
  ));
}

/** Sets the customer only when none is set yet; returns the club's customer either way. */
export async function claimCustomer(clubId: string, customerId: string): Promise<string> {
  const [row] = await db().update(club).set({ customerId }).where(and(eq(club.id, clubId), sql`${club.customerId} is null`)).returning({ c: club.customerId });
  if (row?.c) return row.c;
  return (await clubById(clubId))!.customerId!;
}

/** Runs `fn` holding the club's row lock, so two webhooks for one club apply one after the other. */
export async function withClubLocked<T>(clubId: string, fn: (current: ClubRow, tx: Tx) => Promise<T>): Promise<T | null> {
  return db().transaction(async (tx) => {
    const [row] = await tx.select().from(club).where(eq(club.id, clubId)).for("update");
    if (!row) return null;
    return fn(row, tx);
  });
}

export async function updateClub(tx: Tx, clubId: string, patch: Partial<typeof club.$inferInsert>) {
  await tx.update(club).set(patch).where(eq(club.id, clubId));
}

/** Records an event id; false when it was already recorded (a second delivery). */
export async function recordEvent(e: { id: string; type: string; clubId: string | null; createdAtService: Date }): Promise<boolean> {
  const rows = await db().insert(billingEvent).values(e).onConflictDoNothing().returning({ id: billingEvent.id });
  return rows.length > 0;
}

export async function forgetEvent(id: string) {
  await db().delete(billingEvent).where(eq(billingEvent.id, id));
}

const STAFF_ROLES = ["admin", "coach", "analyst"];
const firstRole = sql`split_part(${member.role}, ',', 1)`;

/** Distinct people in a staff role in any of the club's teams, members and pending invitations (by e-mail). */
export async function staffEmailsOfClub(clubId: string): Promise<Set<string>> {
  const teams = db().select({ id: clubTeam.teamId }).from(clubTeam).where(eq(clubTeam.clubId, clubId));
  const members = await db().select({ email: user.email }).from(member).innerJoin(user, eq(user.id, member.userId))
    .where(and(inArray(member.organizationId, teams), inArray(firstRole, STAFF_ROLES)));
  const invited = await db().select({ email: invitation.email }).from(invitation)
    .where(and(inArray(invitation.organizationId, teams), eq(invitation.status, "pending"), inArray(sql`split_part(${invitation.role}, ',', 1)`, STAFF_ROLES), sql`${invitation.expiresAt} > now()`));
  return new Set([...members, ...invited].map((r) => r.email.toLowerCase()));
}

/** Team admins of every team of the club (who hear about payments). */
export async function adminsOfClub(clubId: string) {
  const rows = await db().selectDistinct({ id: user.id, email: user.email, name: user.name }).from(member)
    .innerJoin(user, eq(user.id, member.userId)).innerJoin(clubTeam, eq(clubTeam.teamId, member.organizationId))
    .where(and(eq(clubTeam.clubId, clubId), sql`${firstRole} = 'admin'`));
  return rows;
}

/** Is this user a team admin of one of the club's teams? */
export async function isClubAdmin(clubId: string, userId: string) {
  const [row] = await db().select({ n: sql<number>`1` }).from(member).innerJoin(clubTeam, eq(clubTeam.teamId, member.organizationId))
    .where(and(eq(clubTeam.clubId, clubId), eq(member.userId, userId), sql`${firstRole} = 'admin'`)).limit(1);
  return !!row;
}

export async function deleteClub(id: string) {
  await db().delete(club).where(eq(club.id, id));
}

export const inTransaction = <T>(fn: (tx: Tx) => Promise<T>) => db().transaction(fn);

/** A team (better-auth's organization row) with its first member, a team admin. */
export async function insertTeamWithAdmin(tx: Tx, t: { name: string; slug: string; adminId: string }) {
  const id = crypto.randomUUID();
  await tx.insert(organization).values({ id, name: t.name, slug: t.slug, createdAt: new Date() });
  await tx.insert(member).values({ id: crypto.randomUUID(), organizationId: id, userId: t.adminId, role: "admin", createdAt: new Date() });
  return id;
}
