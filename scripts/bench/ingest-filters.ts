// The cost of the picture filters of decision 132, each beside the raw ffmpeg command doing the
// same (same filter, same niceness, frames to JPEG): HDR tone-mapping (HLG, 10-bit HEVC) and
// deinterlacing (one picture per field). Our figure is extractFrames (frames, times, strip).
import { execFileSync } from "node:child_process";
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { deinterlace, extractFrames, hdrToSdr, probe } from "../../server/media/index";

const ffmpeg = (...a: string[]) => execFileSync("nice", ["-n", "10", "ffmpeg", "-hide_banner", "-loglevel", "error", "-nostdin", "-y", ...a]);

async function timed(fn: () => Promise<unknown> | unknown): Promise<number> {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
}

export async function filterCosts(frames = 240): Promise<void> {
  const dir = await mkdtemp(path.join(os.tmpdir(), "lf-bench-filters-"));
  try {
    const src = `testsrc2=s=1280x720:r=50,format=yuv420p`;
    const hlg = path.join(dir, "hlg.mp4");
    ffmpeg("-f", "lavfi", "-i", src, "-frames:v", String(frames),
      "-vf", "zscale=tin=709:min=709:pin=709:rin=limited:t=linear:p=709:npl=100,format=gbrpf32le,zscale=p=2020:t=arib-std-b67:m=2020_ncl:r=limited,format=yuv420p10le",
      "-c:v", "libx265", "-preset", "ultrafast", "-x265-params", "log-level=error", "-color_primaries", "bt2020", "-color_trc", "arib-std-b67", "-colorspace", "bt2020nc", hlg);
    const inter = path.join(dir, "interlaced.mp4");
    ffmpeg("-f", "lavfi", "-i", src, "-frames:v", String(frames), "-vf", "tinterlace=mode=interleave_top,setfield=tff",
      "-c:v", "libx264", "-preset", "ultrafast", "-flags", "+ildct+ilme", "-x264opts", "tff=1", "-field_order", "tt", inter);
    const config = { ffmpegPath: "ffmpeg", ffprobePath: "ffprobe" };
    const rows: [string, number, number][] = [];
    for (const [label, file, vf] of [["HDR tone-mapping (HLG → SDR)", hlg, hdrToSdr], ["deinterlacing (bwdif, per field)", inter, deinterlace]] as const) {
      const raw = path.join(dir, "raw");
      execFileSync("mkdir", ["-p", raw]);
      const rawMs = await timed(() => ffmpeg("-threads", "2", "-i", file, "-vf", vf, "-q:v", "3", path.join(raw, "%06d.jpg")));
      const p = await probe(config, file);
      const oursMs = await timed(() => extractFrames(config, { input: file, probe: p, outDir: path.join(dir, "ours") }));
      rows.push([label, rawMs, oursMs]);
      await rm(raw, { recursive: true, force: true });
      await rm(path.join(dir, "ours"), { recursive: true, force: true });
    }
    console.log(`\n== Picture filters (${frames} frames 1280x720, load average ${os.loadavg()[0].toFixed(2)}) ==`);
    for (const [label, rawMs, oursMs] of rows)
      console.log(`${label.padEnd(34)} raw ffmpeg with the same filter ${(rawMs / 1000).toFixed(2)} s · ours ${(oursMs / 1000).toFixed(2)} s · ratio ${(oursMs / rawMs).toFixed(2)}`);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

if (process.argv[1]?.endsWith("ingest-filters.ts")) await filterCosts(Number(process.argv[2]) || 240);
