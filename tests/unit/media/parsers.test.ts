// Pure parsers: ffmpeg's -progress blocks, packet/frame timestamp lists, probe JSON helpers.
// Formats as printed by ffmpeg/ffprobe 5.1 on this machine.
import { describe, expect, it } from "vitest";
import { isStillImage, looksLikePlaybackRate, parseRate, rotationOf, taggedCaptureRate, withoutPlaceTags } from "../../../server/media/probe";
import { percentOf, ProgressParser } from "../../../server/media/progress";
import { frameTimesFromDecodedCsv, frameTimesFromPackets, parsePacketCsv, parseTimeBase } from "../../../server/media/timestamps";

describe("ProgressParser", () => {
  const block = (frame: number, end = false) =>
    `frame=${frame}\nfps=0.00\nstream_0_0_q=3.0\nbitrate=N/A\ntotal_size=N/A\nout_time_us=${frame * 1000}\nout_time=00:00:00.0\ndup_frames=0\ndrop_frames=0\nspeed=1x\nprogress=${end ? "end" : "continue"}\n`;

  it("returns a block only when its progress= line has arrived, whatever the chunking", () => {
    const text = block(12) + block(480, true);
    const p = new ProgressParser();
    const got = [];
    for (let i = 0; i < text.length; i += 7) got.push(...p.push(text.slice(i, i + 7)));
    expect(got).toEqual([
      { frame: 12, outTimeUs: 12000, totalSize: undefined, end: false },
      { frame: 480, outTimeUs: 480000, totalSize: undefined, end: true },
    ]);
  });

  it("percent stays below 100 until the end and never goes past it", () => {
    expect(percentOf(240, 480, false)).toBe(50);
    expect(percentOf(480, 480, false)).toBe(99);
    expect(percentOf(600, 480, false)).toBe(99);
    expect(percentOf(480, 480, true)).toBe(100);
    expect(percentOf(5, 0, false)).toBe(0);
  });
});

describe("timestamps", () => {
  it("sorts packet times into presentation order, skips discarded packets, starts at 0", () => {
    // Decode order of an IBBP stream: pts 0, 3, 1, 2 (ticks of 1/30 s); one packet discarded by an edit list.
    const csv = "-1,-2,K__D\n0,-1,K__\n3,0,___\n1,1,___\n2,2,___\n";
    const packets = parsePacketCsv(csv);
    expect(packets[0]).toEqual({ pts: -1, dts: -2, discard: true });
    expect(frameTimesFromPackets(packets, "1/30")).toEqual([0, 0.033333, 0.066667, 0.1]);
  });

  it("falls back to dts when a container has no pts", () => {
    expect(frameTimesFromPackets(parsePacketCsv("N/A,10,K_\nN/A,20,K_\n"), "1/1000")).toEqual([0, 0.01]);
  });

  it("reads decoded frame times", () => {
    expect(frameTimesFromDecodedCsv("0.500000\n0.533333,\nN/A\n0.566667\n")).toEqual([0, 0.033333, 0.066667]);
  });

  it("rejects a time base that is not a positive fraction", () => {
    expect(parseTimeBase("1/15360")).toBeCloseTo(1 / 15360, 12);
    expect(() => parseTimeBase("0/0")).toThrow(/time base/);
  });
});

describe("probe helpers", () => {
  it("parses rates and ignores 0/0", () => {
    expect(parseRate("30000/1001")).toBeCloseTo(29.97, 2);
    expect(parseRate("0/0")).toBeNull();
    expect(parseRate(undefined)).toBeNull();
  });

  it("reads rotation clockwise: display matrix angles are counter-clockwise, the old rotate tag clockwise", () => {
    // libavutil/display.h: av_display_rotation_get() returns the counter-clockwise angle [M].
    expect(rotationOf({ index: 0, side_data_list: [{ side_data_type: "Display Matrix", rotation: -90 }] })).toBe(90);
    expect(rotationOf({ index: 0, side_data_list: [{ side_data_type: "Display Matrix", rotation: 90 }] })).toBe(270);
    expect(rotationOf({ index: 0, side_data_list: [{ rotation: 180 }] })).toBe(180);
    expect(rotationOf({ index: 0, tags: { rotate: "90" } })).toBe(90);
    expect(rotationOf({ index: 0 })).toBe(0);
  });

  it("reads a capture rate a phone wrote as a tag", () => {
    expect(taggedCaptureRate({ format: { tags: { "com.android.capture.fps": "240.000000" } } })).toBe(240);
    expect(taggedCaptureRate({ streams: [{ index: 0, tags: { "com.example.capture-frame-rate": "960" } }] })).toBe(960);
    expect(taggedCaptureRate({ format: { tags: { "com.android.version": "14" } } })).toBe(null);
  });

  it("knows an image from a video", () => {
    expect(isStillImage("png_pipe", "png", null)).toBe(true);
    expect(isStillImage("image2", "mjpeg", null)).toBe(true);
    expect(isStillImage("mov,mp4,m4a,3gp,3g2,mj2", "png", 1)).toBe(true);
    expect(isStillImage("avi", "mjpeg", 900)).toBe(false); // lab cameras write MJPEG AVI
    expect(isStillImage("mov,mp4,m4a,3gp,3g2,mj2", "h264", 1)).toBe(false);
    expect(isStillImage("matroska,webm", "mjpeg", 300)).toBe(false); // Motion-JPEG in Matroska
  });

  it("treats a stored rate of 60 fps or less as a likely playback rate (issue 3)", () => {
    expect(looksLikePlaybackRate(30)).toBe(true);
    expect(looksLikePlaybackRate(60)).toBe(true);
    expect(looksLikePlaybackRate(240)).toBe(false);
  });
});

describe("withoutPlaceTags", () => {
  it("drops where a real file says it was filmed, keeps the rest", async () => {
    // A real MP4 written by ffmpeg with a QuickTime location, read back by ffprobe.
    const { execFileSync } = await import("node:child_process");
    const { mkdtempSync, rmSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const path = await import("node:path");
    const dir = mkdtempSync(path.join(tmpdir(), "lf-place-"));
    try {
      const f = path.join(dir, "placed.mov");
      execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-f", "lavfi", "-i", "testsrc2=size=64x48:rate=30", "-frames:v", "3",
        "-metadata", "location=+45.5017-073.5673/", "-metadata", "title=Drill 4", "-c:v", "mjpeg", f]);
      const raw = JSON.parse(execFileSync("ffprobe", ["-v", "error", "-print_format", "json", "-show_streams", "-show_format", f]).toString());
      expect(JSON.stringify(raw)).toContain("45.5017"); // the fixture really carries a place
      const kept = withoutPlaceTags(raw);
      expect(JSON.stringify(kept)).not.toContain("45.5017");
      expect(kept.format?.tags?.title).toBe("Drill 4");
      expect(kept.streams?.length).toBe(raw.streams.length);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it("takes GPS and Android location keys out of streams too", () => {
    const kept = withoutPlaceTags({ streams: [{ index: 0, tags: { "location-eng": "+1+2/", GPSLatitude: "1", rotate: "90" } }], format: { tags: { "com.apple.quicktime.location.ISO6709": "+1+2/", encoder: "x" } } });
    expect(kept.streams?.[0].tags).toEqual({ rotate: "90" });
    expect(kept.format?.tags).toEqual({ encoder: "x" });
  });
});
