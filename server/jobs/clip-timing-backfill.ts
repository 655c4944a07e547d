// Clips stored before ingest kept their frame clock (decision 131) have raw container times and no
// `timing`: a coarse clock (a 600 time scale, Matroska's millisecond) swings their speeds, and their
// gaps go unflagged. The clip sweep gives them the facts new uploads get (decision 137): the stored
// original is probed again through the one ffmpeg wrapper (the container's clock resolution, its
// stated rates and the frames its header promises) and the stored frames' own times are analysed
// on that clock, so gaps and repeats are numbered by the frames actually stored. Idempotent: only
// clips still without timing are read, and the write happens only while the row has none.
import { createWriteStream } from "node:fs";
import { pipeline } from "node:stream/promises";
import path from "node:path";
import type pino from "pino";
import { probe, withJobDir, jobTmpRoot } from "../media";
import { analyseTiming } from "../media/timing";
import { clipKeys } from "../storage";
import { mediaConfig, storage } from "../clips/deps";
import { clipsWithoutTiming, countClipsWithoutTiming, setClipTiming } from "../entities/clip/repository";
import { recomputeLater } from "../shots/results";

export interface TimingBackfillReport {
  done: number;
  /** Clips whose original could not be read this time (tried again by the next sweep). */
  failed: string[];
  left: number;
}

type Row = Awaited<ReturnType<typeof clipsWithoutTiming>>[number];

/** Backfill for up to `budgetMs` (the sweep runs every five minutes), logging progress per clip. */
export async function backfillClipTiming(log: pino.Logger, o: { budgetMs?: number; batch?: number } = {}): Promise<TimingBackfillReport> {
  const started = Date.now();
  const budget = o.budgetMs ?? 60_000;
  const batch = o.batch ?? 20;
  const total = await countClipsWithoutTiming();
  const report: TimingBackfillReport = { done: 0, failed: [], left: total };
  if (!total) return report;
  log.info({ clips: total }, "clip timing backfill: clips stored without a frame clock");
  while (Date.now() - started < budget) {
    const rows = (await clipsWithoutTiming(batch + report.failed.length)).filter((r) => !report.failed.includes(r.id));
    if (!rows.length) break;
    for (const r of rows) {
      if (Date.now() - started >= budget) break;
      try {
        if (await backfillOne(r)) report.done++;
      } catch (err) {
        report.failed.push(r.id);
        log.warn({ err, clipId: r.id }, "clip timing backfill: could not read the stored original; the next sweep tries again");
      }
      log.info({ clipId: r.id, done: report.done, of: total }, `clip timing backfill: ${report.done} of ${total}`);
    }
  }
  report.left = await countClipsWithoutTiming();
  log.info({ done: report.done, failed: report.failed.length, left: report.left }, "clip timing backfill: pass finished");
  return report;
}

/** One clip: true when its timing was written (false when someone else did first). */
async function backfillOne(r: Row): Promise<boolean> {
  const times = r.frameTimes ?? [];
  if (!times.length || (r.frameCount !== null && times.length !== r.frameCount)) throw new Error(`the clip has ${times.length} stored frame times for ${r.frameCount} frames`);
  const st = storage();
  const media = mediaConfig();
  const key = clipKeys.original(r.id);
  const p = await withJobDir({ tmpRoot: jobTmpRoot(media, st) }, `timing-${r.id}`, async (dir) => {
    let input = st.localPath(key);
    if (!input) {
      input = path.join(dir, "original");
      await pipeline((await st.get(key)).body, createWriteStream(input));
    }
    return probe(media, input);
  });
  // Stored before fields were split, an interlaced clip holds one picture per frame: its hints and
  // header count are per frame, not per field.
  const perFrame = p.interlaced ? 2 : 1;
  const { times: snapped, timing } = analyseTiming(times, p.timing.tickS, [r.storedFps, p.storedFps / perFrame]);
  const promised = Math.max(p.expectedFrames, p.frameCount) / perFrame;
  const reached = Math.round((snapped[snapped.length - 1] ?? 0) * timing.nominalFps) + 1;
  if (promised - reached > Math.max(1, 0.01 * promised)) timing.missingTail = { from: reached + 1, to: promised };
  const moved = snapped.some((t, i) => Math.abs(t - times[i]) > 1.5e-6) || timing.nominalFps !== r.storedFps;
  // Stored times and the stored rate change together, so capture times (stored × stored rate ÷
  // capture rate) keep their scale; the capture rate the person has is left as it is.
  if (!(await setClipTiming(r.id, { timing, frameTimes: snapped, storedFps: timing.nominalFps }))) return false;
  // Results were computed on the raw times: compute them again on the clock.
  if (moved) await recomputeLater({ scope: "clip", id: r.id });
  return true;
}
