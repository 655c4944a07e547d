// A clip as the clips table shows it (ClipSummary), built by PostgreSQL as JSON: the SQL twin of
// toSummary (server/clips/present.ts), which stays the definition. The clip list answers with this
// text as it comes, so the web process neither parses a page of rows nor serialises it again
// (docs/decisions/195-hot-reads-in-one-statement.md). tests/api/hot-reads.test.ts holds the
// two equal, key for key, over clips in every state.
import { sql } from "drizzle-orm";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import { clip, stick, trainingSession, user } from "../../db/schema";

/** `{ id, name }` of a referenced person or thing, or null when the clip names none. */
const ref = (id: AnyPgColumn, key: "name" | "label", name: AnyPgColumn) =>
  sql`case when ${id} is null then null else json_build_object('id', ${id}, ${sql.raw(`'${key}'`)}, coalesce(${name}, '')) end`;

/** The summary of the clip in the outer query; `uploaderName` is the uploader's name column (an alias of user). */
export function clipSummaryJson(uploaderName: AnyPgColumn) {
  const base = sql`'/api/teams/' || ${clip.teamId} || '/clips/' || ${clip.id}`;
  return sql<string>`json_build_object(
    'id', ${clip.id}, 'title', ${clip.title}, 'status', ${clip.status}, 'failureReason', ${clip.failureReason},
    'framesDone', ${clip.framesDone}, 'frameCount', ${clip.frameCount},
    'progress', case when ${clip.status} = 'ready' then 1 when coalesce(${clip.frameCount}, 0) = 0 then 0
      else least(1, ${clip.framesDone}::float8 / ${clip.frameCount}) end,
    'captureFps', ${clip.captureFps}, 'captureFpsConfirmed', ${clip.captureFpsConfirmed}, 'storedFps', ${clip.storedFps},
    'needsCaptureRateConfirmation', not ${clip.captureFpsConfirmed},
    'shotType', ${clip.shotType}, 'cameraView', ${clip.cameraView},
    'player', ${ref(clip.playerId, "name", user.name)},
    'session', case when ${trainingSession.id} is null then null else json_build_object('id', ${trainingSession.id}, 'date', ${trainingSession.date},
      'venue', ${trainingSession.venue}, 'drill', ${trainingSession.drill}) end,
    'stick', ${ref(clip.stickId, "label", stick.label)},
    'width', ${clip.width}, 'height', ${clip.height}, 'durationS', ${clip.durationS}, 'rotationDeg', ${clip.rotationDeg},
    'variableFrameRate', ${clip.variableFrameRate}, 'timing', ${clip.timing}, 'codec', ${clip.codec}, 'sizeBytes', ${clip.sizeBytes},
    'originalName', ${clip.originalName}, 'uploadedBy', ${ref(clip.uploadedBy, "name", uploaderName)},
    'createdAt', to_char(${clip.createdAt} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'),
    'thumbnailUrl', case when ${clip.framesDone} > 0 or ${clip.status} = 'ready' then ${base} || '/thumbnail' end,
    'stripUrl', case when ${clip.status} = 'ready' then ${base} || '/strip' end,
    'frameUrlBase', ${base} || '/frames')`;
}
