import { eq } from "drizzle-orm";
import { createAccount } from "../auth/accounts";
import { db } from "../db/client";
import { club, clubTeam, member, organization, user } from "../db/schema";
import type { Role } from "../../shared/schemas/roster";

// A made-up club for the demo: no real team, person or brand.
export const DEMO_TEAM = { name: "Lakeport Ravens", slug: "lakeport-ravens" };
export const DEMO_SECOND_TEAM = { name: "Lakeport Ravens U16", slug: "lakeport-ravens-u16" };
export const DEMO_CLUB = "Lakeport Ravens";
export const DEMO_PASSWORD = "ravens-demo-2026";

export const demoPeople: { email: string; name: string; role: Role; alsoU16?: Role }[] = [
  { email: "admin@ravens.example", name: "Dana Whitlock", role: "admin", alsoU16: "admin" },
  { email: "coach@ravens.example", name: "Morgan Ashby", role: "coach", alsoU16: "coach" },
  { email: "analyst@ravens.example", name: "Priya Lindqvist", role: "analyst" },
  { email: "player@ravens.example", name: "Theo Marchetti", role: "player" },
  { email: "player2@ravens.example", name: "Jonah Okafor", role: "player" },
  { email: "player3@ravens.example", name: "Elin Sandberg", role: "player", alsoU16: "player" },
];

async function ensureUser(email: string, name: string) {
  const [found] = await db().select().from(user).where(eq(user.email, email));
  if (found) return found.id;
  return (await createAccount({ email, name, password: DEMO_PASSWORD, emailVerified: true, signIn: false })).userId;
}

async function ensureTeam(t: { name: string; slug: string }) {
  const [found] = await db().select().from(organization).where(eq(organization.slug, t.slug));
  if (found) return found.id;
  const id = crypto.randomUUID();
  await db().insert(organization).values({ id, name: t.name, slug: t.slug, createdAt: new Date() });
  return id;
}

async function ensureMember(teamId: string, userId: string, role: Role) {
  const rows = await db().select().from(member).where(eq(member.userId, userId));
  if (rows.some((m) => m.organizationId === teamId)) return;
  await db().insert(member).values({ id: crypto.randomUUID(), organizationId: teamId, userId, role, createdAt: new Date() });
}

export interface DemoIds {
  teamId: string;
  secondTeamId: string;
  users: Record<string, string>;
}

/** Both demo teams in one club, on the largest plan, granted (no subscription). */
async function ensureDemoClub(teamIds: string[]) {
  const [linked] = await db().select({ clubId: clubTeam.clubId }).from(clubTeam).where(eq(clubTeam.teamId, teamIds[0]!));
  const clubId = linked?.clubId ?? (await db().insert(club).values({ name: DEMO_CLUB, plan: "arena" }).returning())[0]!.id;
  for (const teamId of teamIds) await db().insert(clubTeam).values({ teamId, clubId }).onConflictDoNothing();
}

export async function seedPeople(): Promise<DemoIds> {
  const teamId = await ensureTeam(DEMO_TEAM);
  const secondTeamId = await ensureTeam(DEMO_SECOND_TEAM);
  await ensureDemoClub([teamId, secondTeamId]);
  const users: Record<string, string> = {};
  for (const p of demoPeople) {
    const id = await ensureUser(p.email, p.name);
    users[p.email] = id;
    await ensureMember(teamId, id, p.role);
    if (p.alsoU16) await ensureMember(secondTeamId, id, p.alsoU16);
  }
  return { teamId, secondTeamId, users };
}
