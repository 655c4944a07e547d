// Exports of one shot, in the viewer's units (their preference unless the request names units).
// The same visibility as the readout: a shot one may not see answers 404, like a missing one.
import type { Actor } from "../auth/policy";
import { env } from "../env";
import { getPrefs } from "../entities/user/prefs";
import { readoutPath, shotTitle } from "../../shared/schemas/readout";
import type { UnitSystem } from "../../shared/units";
import { marksCsv, resultsCsv } from "./csv";
import { shotClockOf } from "./present";
import { eventThumbs, renderShotReport } from "./pdf/render";
import { teamName } from "../entities/team/repository";
import { getReadout, resultsOrThrow, visibleShot } from "./service";
import { shotDate } from "../entities/shot/date";

export interface FileAnswer {
  filename: string;
  contentType: string;
  body: string | Buffer;
}

async function unitsFor(a: Actor, asked: UnitSystem | undefined): Promise<UnitSystem> {
  return asked ?? (await getPrefs(a.userId)).units;
}

/** "wrist-shot-theo-marchetti-2026-03-02" — ASCII only, safe in a Content-Disposition header. */
export function fileStem(title: string, shotId: string): string {
  const stem = title
    .normalize("NFKD")
    .replace(/[^\x20-\x7e]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
  return stem || `shot-${shotId.slice(0, 8)}`;
}

export async function marksExport(a: Actor, shotId: string, asked?: UnitSystem): Promise<FileAnswer> {
  const { row } = await visibleShot(a, shotId, "That shot", { marks: "always" });
  const units = await unitsFor(a, asked);
  const title = shotTitle({ label: row.label, shotType: row.shotType, date: shotDate(row), playerName: row.playerName });
  return {
    filename: `${fileStem(title, shotId)}-marks.csv`,
    contentType: "text/csv; charset=utf-8",
    body: marksCsv({ marks: row.marks ?? {}, captureFps: row.captureFps, frameTimes: shotClockOf(row), frameStart: row.frameStart, puckStrike: row.events.puckStrike ?? null, calibration: row.calibration, units }),
  };
}

export async function resultsExport(a: Actor, shotId: string, asked?: UnitSystem): Promise<FileAnswer> {
  const r = await getReadout(a, shotId);
  const units = await unitsFor(a, asked);
  return { filename: `${fileStem(shotTitle(r.shot), shotId)}-results.csv`, contentType: "text/csv; charset=utf-8", body: resultsCsv(resultsOrThrow(r), units) };
}

export async function reportExport(a: Actor, shotId: string, asked?: UnitSystem): Promise<FileAnswer> {
  const r = await getReadout(a, shotId);
  resultsOrThrow(r);
  const units = await unitsFor(a, asked);
  const body = await renderShotReport({
    readout: r, units, teamName: (await teamName(a.teamId)) ?? "your team", url: env().PUBLIC_URL + readoutPath(shotId, a.teamId), generatedAt: new Date(),
    thumbs: await eventThumbs(r),
  });
  return { filename: `${fileStem(shotTitle(r.shot), shotId)}-report.pdf`, contentType: "application/pdf", body };
}
