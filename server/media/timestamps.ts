// Each frame's real presentation time. The cheap source is the demuxer's packet list (no
// decoding): with ffmpeg writing every decoded frame once (-fps_mode passthrough), the sorted
// packet times of the video stream are the frame times. When the counts disagree (damaged
// packets, odd edit lists) the caller falls back to decoding, which is exact but costs a decode.

export interface PacketTime {
  pts: number | null;
  dts: number | null;
  discard: boolean;
}

/** "1/15360" → 1/15360 s per tick. */
export function parseTimeBase(tb: string): number {
  const [n, d] = tb.split("/").map(Number);
  const v = n / d;
  if (!Number.isFinite(v) || v <= 0) throw new Error(`Not a time base: ${tb}`);
  return v;
}

/** Lines of `ffprobe -show_entries packet=pts,dts,flags -of csv=p=0`. */
export function parsePacketCsv(csv: string): PacketTime[] {
  const out: PacketTime[] = [];
  for (const line of csv.split("\n")) {
    const t = line.trim();
    if (!t) continue;
    const [pts, dts, flags = ""] = t.split(",");
    const n = (v: string | undefined) => (v === undefined || v === "" || v === "N/A" ? null : Number(v));
    out.push({ pts: n(pts), dts: n(dts), discard: flags.includes("D") });
  }
  return out;
}

const round6 = (s: number) => Math.round(s * 1e6) / 1e6;

/** Seconds from the first frame, in presentation order. Discarded packets are never output. */
export function frameTimesFromPackets(packets: PacketTime[], timeBase: string): number[] {
  const tb = parseTimeBase(timeBase);
  const ticks = packets
    .filter((p) => !p.discard)
    .map((p) => p.pts ?? p.dts)
    .filter((v): v is number => v !== null && Number.isFinite(v))
    .sort((a, b) => a - b);
  if (ticks.length === 0) return [];
  return ticks.map((t) => round6((t - ticks[0]) * tb));
}

/** Lines of `ffprobe -show_entries frame=best_effort_timestamp_time -of csv=p=0` (decode order = output order). */
export function frameTimesFromDecodedCsv(csv: string): number[] {
  const secs = csv
    .split("\n")
    .map((l) => l.trim().replace(/,$/, ""))
    .filter((l) => l && l !== "N/A")
    .map(Number)
    .filter(Number.isFinite);
  if (secs.length === 0) return [];
  return secs.map((s) => round6(s - secs[0]));
}
