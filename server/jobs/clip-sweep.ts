// clip.sweep: repair what a killed worker, a lost job or a half-done delete left behind, using
// the database as the truth. Clips still "extracting" with no live job are queued again; a job
// whose clip has not moved for a while is handed back to pg-boss as failed, so it is retried
// with backoff; ready clips whose frames are gone are extracted again; files of clips that no
// longer exist are removed.
import type pino from "pino";
import { z } from "zod";
import { sweepStaleJobDirs } from "../media/ffmpeg";
import { clipKeys, LocalDiskStorage } from "../storage";
import { mediaConfig, storage } from "../clips/deps";
import { clipById, existingClipIds, readyClips, staleExtracting, updateClip } from "../entities/clip/repository";
import { failJob, liveExtractJobs, sendExtract } from "./clip-queue";
import { jobPolicies } from "./types";

// A running extraction writes progress every quarter second; this long without a change means
// its worker is gone. CLIP_STALE_SECONDS lets the fault tests use a short wait.
const staleMs = () => z.coerce.number().positive().default(120).parse(process.env.CLIP_STALE_SECONDS) * 1000;
/** Files without a clip row are only removed once this old (an ingest stores before it inserts). */
export const ORPHAN_MIN_AGE_MS = 15 * 60_000;

export interface SweepReport { requeued: string[]; handedBack: string[]; reextract: string[]; orphansRemoved: string[] }

export async function sweepClips(log: pino.Logger, opts: { orphanMinAgeMs?: number } = {}): Promise<SweepReport> {
  const report: SweepReport = { requeued: [], handedBack: [], reextract: [], orphansRemoved: [] };

  for (const { id } of await staleExtracting(staleMs())) {
    const live = await liveExtractJobs(id);
    const active = live.find((j) => j.state === "active");
    if (active) {
      await failJob(active.id, "The worker stopped reporting progress (it may have been killed); trying again.");
      if (active.retryCount >= jobPolicies["clip.extract"].retryLimit) {
        // The last attempt died too: stop rather than loop on a clip that kills its worker.
        await updateClip(id, { status: "failed", failureReason: "The worker stopped while extracting this clip on every attempt (out of memory?). Retry once the cause is fixed." });
      }
      report.handedBack.push(id);
    } else if (!live.length) {
      await sendExtract(id);
      report.requeued.push(id);
    }
  }

  const st = storage();
  for (const c of await readyClips()) {
    const fmt = c.frameFormat === "webp" ? "webp" : "jpg";
    const last = c.frameCount ? await st.exists(clipKeys.frame(c.id, c.frameCount, fmt)) : true;
    if (last && (await st.exists(clipKeys.strip(c.id)))) continue;
    if (!(await st.exists(clipKeys.original(c.id)))) {
      await updateClip(c.id, { status: "failed", failureReason: "The stored original is missing; upload the clip again." });
      continue;
    }
    await updateClip(c.id, { status: "extracting", framesDone: 0 });
    await sendExtract(c.id);
    report.reextract.push(c.id);
  }

  const minAge = opts.orphanMinAgeMs ?? ORPHAN_MIN_AGE_MS;
  const newest = new Map<string, number>();
  for (const o of await st.list("clips/")) {
    const clipId = o.key.split("/")[1];
    newest.set(clipId, Math.max(newest.get(clipId) ?? 0, o.modifiedAt.getTime()));
  }
  const known = await existingClipIds([...newest.keys()].filter((k) => /^[0-9a-f-]{36}$/.test(k)));
  for (const [clipId, touched] of newest) {
    if (known.has(clipId) || Date.now() - touched < minAge) continue;
    // No catch here: "the database is away" must never read as "no such clip" (that would delete its files).
    if (await clipById(clipId)) continue;
    await st.deletePrefix(`clips/${clipId}/`);
    report.orphansRemoved.push(clipId);
  }

  await sweepStaleJobDirs(mediaConfig(), 6 * 3600_000);
  if (st instanceof LocalDiskStorage) await st.sweepPartials(6 * 3600_000);
  if (Object.values(report).some((v) => v.length)) log.info(report, "clip sweep repaired");
  return report;
}
