// The demo club's clip: a synthetic slap shot (a blade sweeps in, strikes the puck at frame 150,
// the puck leaves), made with ffmpeg's own drawing filters and ingested through the real
// pipeline (probe, store by id, extract every frame). Stored at 30 fps; the made-up lab camera
// captured it at 3,200 fps, confirmed. Nothing here comes from a real clip.
import { and, eq } from "drizzle-orm";
import path from "node:path";
import { db } from "../db/client";
import { clip, stick } from "../db/schema";
import { log } from "../log";
import { buildFfmpegArgs } from "../media/command";
import { runTool, withJobDir } from "../media/ffmpeg";
import { ingestUpload } from "../clips/ingest";
import { mediaConfig } from "../clips/deps";
import { updateClip } from "../entities/clip/repository";
import { extractClip } from "../jobs/clip-extract";
import { DEMO_STICK_LABELS } from "./sticks";
import type { DemoIds } from "./demo-people";

export const DEMO_CLIP_TITLE = "Demo: slap shot, side view";
export const DEMO_CLIP = {
  title: DEMO_CLIP_TITLE, width: 960, height: 540, frames: 300, storedFps: 30, captureFps: 3200,
  /** The frame in which the blade first touches the puck, and the puck's diameter in pixels. */
  puckStrikeFrame: 150, puckDiameterPx: 24,
} as const;

/** The demo clip of a team (for other seed steps, e.g. shots with marks), or null. */
export async function demoClipId(teamId: string): Promise<string | null> {
  const [row] = await db().select({ id: clip.id }).from(clip).where(and(eq(clip.teamId, teamId), eq(clip.title, DEMO_CLIP_TITLE)));
  return row?.id ?? null;
}

// Ice, a board line with two blue markers 800 px apart, a dark blade and a black puck; n is the
// frame index (0-based), so frame 151 (1-based) is the first with the puck moving.
const scene = (w: number, h: number, fps: number) =>
  `color=c=0xDCE6EC:s=${w}x${h}:r=${fps}[ice];` +
  `color=c=black:s=24x24:r=${fps},format=rgba,geq=r=20:g=20:b=24:a='if(lte(hypot(X-11.5,Y-11.5),11.5),255,0)'[puck];` +
  `color=c=0x2B2118:s=96x14:r=${fps}[blade];` +
  `[ice]drawbox=x=0:y=470:w=${w}:h=6:color=0x9FB7C6:t=fill,drawbox=x=80:y=500:w=4:h=20:color=0x1F5F8B:t=fill,` +
  `drawbox=x=880:y=500:w=4:h=20:color=0x1F5F8B:t=fill[bg];` +
  `[bg][blade]overlay=x='if(lt(n,148),40+n*1.3,232+(n-148)*3.1)':y='420-if(gt(n,148),(n-148)*0.4,0)'[b1];` +
  `[b1][puck]overlay=x='if(lt(n,150),330,330+(n-150)*3.9)':y='415-if(gt(n,150),(n-150)*0.55,0)',format=yuv420p[out]`;

export async function makeDemoClipFile(file: string) {
  const d = DEMO_CLIP;
  await runTool(mediaConfig(), {
    tool: "ffmpeg",
    args: buildFfmpegArgs({
      inputs: [],
      filterComplex: scene(d.width, d.height, d.storedFps),
      outputs: [{ path: file, options: ["-map", "[out]", "-frames:v", String(d.frames), "-c:v", "libx264", "-preset", "veryfast", "-crf", "18", "-g", "30"] }],
    }),
    timeoutMs: 120_000,
  });
}

async function seedDemoClip(ids: DemoIds) {
  const existing = await demoClipId(ids.teamId);
  const [row] = existing ? await db().select().from(clip).where(eq(clip.id, existing)) : [];
  if (row?.status === "ready") return;
  const runLog = log.child({ seed: "clips" });
  let id = row?.id;
  if (!id) {
    const playerId = ids.users["player@ravens.example"];
    const [theirStick] = await db().select({ id: stick.id }).from(stick).where(and(eq(stick.teamId, ids.teamId), eq(stick.label, DEMO_STICK_LABELS.usedSenior)));
    const created = await withJobDir(mediaConfig(), "seed-clip", async (dir) => {
      const file = path.join(dir, "demo-slap-shot.mp4");
      await makeDemoClipFile(file);
      return ingestUpload({
        teamId: ids.teamId,
        userId: ids.users["analyst@ravens.example"],
        file,
        originalName: "demo-slap-shot.mp4",
        enqueue: false,
        meta: {
          title: DEMO_CLIP_TITLE,
          newSession: { date: "2026-11-28", venue: "Lakeport Arena, rink 2", drill: "Slap shots from the point" },
          playerId,
          shotType: "slap",
          stickId: theirStick?.id ?? null,
          cameraView: "side",
          captureFps: DEMO_CLIP.captureFps,
          captureFpsConfirmed: true,
          exposureUs: 100,
          notes: "Synthetic demo clip: lab camera at 3,200 fps, exported at 30 fps. The blade meets the puck in frame 150.",
        },
      });
    });
    id = created.id;
  } else {
    await updateClip(id, { status: "extracting" });
  }
  const outcome = await extractClip(id, { log: runLog, lastAttempt: true, notify: false });
  if (outcome !== "ready") throw new Error(`The demo clip did not extract (${outcome}); see the log above.`);
}

/** Demo-data steps for this area, run in order after the people; each must be idempotent. */
export const clipsSeedSteps: { name: string; run: (ids: DemoIds) => Promise<void> }[] = [{ name: "demo clip", run: seedDemoClip }];
