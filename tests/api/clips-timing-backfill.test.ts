// Clips stored before ingest kept a frame clock get one from the clip sweep (decision 137): the
// stored original is probed again and the stored frames' times analysed on the container's clock.
// The old rows are imitated by putting back what ingest stored then: the raw packet times, the
// average rate, no timing.
import { execFileSync } from "node:child_process";
import path from "node:path";
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { ffmpeg, mediaDir } from "./clips-support";
import { teamPath, uploadReady, useCoachWorld } from "./coach-world";
import { db } from "../../server/db/client";
import { log } from "../../server/log";
import { backfillClipTiming } from "../../server/jobs/clip-timing-backfill";

const w = useCoachWorld();

/** Each packet's time as the container stores it, seconds from the first (what ingest kept before). */
const rawTimes = (file: string) => {
  const pts = execFileSync("ffprobe", ["-v", "error", "-select_streams", "v:0", "-show_entries", "packet=pts", "-of", "csv=p=0", file]).toString().trim().split("\n").map(Number).sort((a, b) => a - b);
  return pts.map((p) => Math.round(((p - pts[0]) / 600) * 1e6) / 1e6);
};

async function makeOld(id: string, times: number[], storedFps: number) {
  await db().execute(sql`update clip set timing = null, frame_times = ${JSON.stringify(times)}::jsonb, stored_fps = ${storedFps} where id = ${id}`);
}

describe("clip timing backfill", () => {
  it("a clip stored without timing gets it: a 600 time scale snapped to 240 fps, the dropped frames named; a second pass changes nothing", async () => {
    const f = path.join(mediaDir, "old-phone-240.mov");
    ffmpeg("-f", "lavfi", "-i", "testsrc2=size=160x96:rate=240:duration=1", "-vf", "select='not(between(n,100,102))'", "-fps_mode", "passthrough", "-c:v", "libx264", "-preset", "ultrafast", "-video_track_timescale", "600", f);
    const c = await uploadReady(w, f, "old-phone-240.mov");
    // The probe's packet times are not kept in the clip's probe facts (the frames' times are stored apart).
    const kept = await db().execute(sql`select probe ? 'packetTimes' as has from clip where id = ${c.id}`);
    expect(kept.rows[0]).toEqual({ has: false });
    const raw = rawTimes(f);
    expect(raw.length).toBe(c.frameCount);
    // Raw steps are 3.33 and 5.00 ms: speeds from them swing by ±20 %.
    expect(new Set(raw.slice(1, 20).map((t, i) => Math.round((t - raw[i]) * 1e5)))).toEqual(new Set([333, 500]));
    await makeOld(c.id, raw, (raw.length - 1) / raw[raw.length - 1]);

    const first = await backfillClipTiming(log);
    expect(first.done).toBeGreaterThanOrEqual(1);
    expect(first.failed).toEqual([]);
    expect(first.left).toBe(0);
    const after = (await w.coach.get(`${teamPath(w)}/clips/${c.id}`)).json;
    expect(after.timing).toMatchObject({ clock: "snapped", gaps: [{ after: 100, missing: 3 }], repeatCount: 0, missingTail: null });
    expect(after.storedFps).toBe(240);
    expect(after.frameTimes[99]).toBeCloseTo(99 / 240, 6);
    expect(after.frameTimes[100]).toBeCloseTo(103 / 240, 6);

    const again = await backfillClipTiming(log);
    expect(again).toEqual({ done: 0, failed: [], left: 0 });
    const still = (await w.coach.get(`${teamPath(w)}/clips/${c.id}`)).json;
    expect(still.frameTimes).toEqual(after.frameTimes);
  });
});
