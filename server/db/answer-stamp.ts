// A team's change stamp, read inside a hot read's own statement
// (docs/decisions/192-answer-cache-with-a-change-stamp.md): the folded count in answer_stamp plus
// the change rows not yet folded, for the team and for "*" (a person's name changed). Triggers on
// every table the hot reads read add a row for each writing transaction, so any committed write
// raises the stamp, and an equal stamp read later means nothing those reads read has changed.
import { sql } from "drizzle-orm";
import { answerChange, answerStamp } from "./schema";

/** The stamp of the team in placeholder `teamId`, as text (it is only ever compared). */
export const teamStampSql = sql<string>`((select coalesce(sum(${answerStamp.n}), 0) from ${answerStamp} where ${answerStamp.teamId} in (${sql.placeholder("teamId")}, '*'))
  + (select count(*) from ${answerChange} where ${answerChange.teamId} in (${sql.placeholder("teamId")}, '*')))::text`;

/** Placeholder `knownStamp`: the stamp of the answer the caller holds ("" when none). */
export const knownStamp = sql.placeholder("knownStamp");
