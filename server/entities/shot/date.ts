// A shot's date — THE rule, written once (docs/decisions/121-shot-date.md).
//
// A shot's date is a calendar date (YYYY-MM-DD, no time, no zone): the date of its clip's
// session when the clip belongs to one (the date the coach wrote down), else the day the clip was
// uploaded, by UTC (the server knows no viewer's zone; the upload form always offers a session
// dated with the uploader's own today, so this is the fallback for clips without one). It is
// shown as written, never converted to a time of day, and it picks the bench test in force for
// the shot (server/entities/stick/stiffness.ts).
//
// In SQL the rule is the database function shot_date_rule (migration 0010), and PostgreSQL keeps
// its value in shot.shot_date on every write that can change it: a shot made or moved, its clip
// moved to another session, the session's date corrected (decision 173). Queries read that column,
// which needs no join and sorts from an index; `shotDate` below is the same rule for a row already
// read, and tests/api/shot-date.test.ts holds the two to each other.
import { asc, desc, sql } from "drizzle-orm";
import { shot } from "../../db/schema";

/** The shot's date as `YYYY-MM-DD` text (the stored column). */
export const shotDateSql = sql<string>`${shot.shotDate}::text`;

/** Newest first by that date, then by when the clip and the shot came in (a stable order), exactly
 * as the (team, date …) and (team, player, date …) indexes are ordered. */
export const newestShotFirst = [desc(shot.shotDate), desc(shot.clipCreatedAt), desc(shot.createdAt), asc(shot.id)];

/** The same rule for a row already read. */
export function shotDate(r: { sessionDate: string | null; clipCreatedAt: Date }): string {
  return r.sessionDate ?? r.clipCreatedAt.toISOString().slice(0, 10);
}
