import { eq } from "drizzle-orm";
import { db } from "../../db/client";
import { userPrefs } from "../../db/schema";
import type { Prefs } from "../../../shared/schemas/roster";

export const defaultPrefs: Prefs = { units: "metric", notifyClipReady: true, notifyShotShared: true };

export async function getPrefs(userId: string): Promise<Prefs> {
  const [row] = await db().select().from(userPrefs).where(eq(userPrefs.userId, userId));
  return row ? { units: row.units, notifyClipReady: row.notifyClipReady, notifyShotShared: row.notifyShotShared } : defaultPrefs;
}

export async function savePrefs(userId: string, patch: Partial<Prefs>): Promise<Prefs> {
  const next = { ...(await getPrefs(userId)), ...patch };
  await db().insert(userPrefs).values({ userId, ...next }).onConflictDoUpdate({ target: userPrefs.userId, set: next });
  return next;
}
