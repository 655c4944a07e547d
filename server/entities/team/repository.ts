// A team (better-auth's organization row) and its settings (team_settings: whether shots wait
// for review, the stick alert level). Teams are made with their club (server/entities/club).
import { eq } from "drizzle-orm";
import { db } from "../../db/client";
import { organization, teamSettings } from "../../db/schema";

export async function teamName(teamId: string): Promise<string | null> {
  const [row] = await db().select({ name: organization.name }).from(organization).where(eq(organization.id, teamId));
  return row?.name ?? null;
}

/** The team's settings; a team that never set one has the defaults (review on, the alert level unset). */
export async function teamSettingsOf(teamId: string): Promise<{ autoPublish: boolean; flexAlertPercent: number | null }> {
  const [row] = await db().select({ autoPublish: teamSettings.autoPublish, flexAlertPercent: teamSettings.flexAlertPercent }).from(teamSettings).where(eq(teamSettings.teamId, teamId));
  return { autoPublish: row?.autoPublish ?? false, flexAlertPercent: row?.flexAlertPercent ?? null };
}

export async function setFlexAlertPercent(teamId: string, flexAlertPercent: number) {
  await db()
    .insert(teamSettings)
    .values({ teamId, flexAlertPercent })
    .onConflictDoUpdate({ target: teamSettings.teamId, set: { flexAlertPercent } });
}
