// A shot's date — THE rule, written once (docs/decisions/121-shot-date-and-stiffness.md).
//
// A shot's date is a calendar date (YYYY-MM-DD, no time, no zone): the date of its clip's
// session when the clip belongs to one (the date the coach wrote down), else the day the clip was
// uploaded, by UTC (the server knows no viewer's zone; the upload form always offers a session
// dated with the uploader's own today, so this is the fallback for clips without one). It is
// shown as written, never converted to a time of day, and it picks the bench test in force for
// the shot (server/entities/stick/stiffness.ts).
//
// The SQL form needs the query to join `clip` and `training_session` (the session may be absent).
import { asc, desc, sql } from "drizzle-orm";
import { clip, shot, trainingSession } from "../../db/schema";

/** The shot's date as `YYYY-MM-DD` text, in a query that joins clip and training_session. */
export const shotDateSql = sql<string>`coalesce(${trainingSession.date}, (${clip.createdAt} at time zone 'UTC')::date)::text`;

/** Newest first by that date, then by when the clip and the shot came in (a stable order). */
export const newestShotFirst = [desc(shotDateSql), desc(clip.createdAt), desc(shot.createdAt), asc(shot.id)];

/** The same rule for a row already read. */
export function shotDate(r: { sessionDate: string | null; clipCreatedAt: Date }): string {
  return r.sessionDate ?? r.clipCreatedAt.toISOString().slice(0, 10);
}
