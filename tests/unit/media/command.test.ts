// Command building apart from spawning: the flags the wrapper promises are really in the argv.
// Flag meanings: ffmpeg 5.1 documentation (ffmpeg -h full on this machine).
import { describe, expect, it } from "vitest";
import { buildFfmpegArgs, buildFfprobeArgs, classifyFailure, formatCommand, withNice } from "../../../server/media/command";
import { buildExtractSpec, frameFileName, webpQuality, type ExtractSpecInput } from "../../../server/media/extract";

const after = (args: string[], flag: string) => args[args.indexOf(flag) + 1];

describe("buildFfmpegArgs", () => {
  const spec = {
    inputs: [{ path: "/tmp/in.mp4" }],
    outputs: [{ path: "/tmp/out/%06d.jpg", options: ["-q:v", "3"] }],
  };

  it("never reads stdin, keeps stderr to errors and asks for progress on stdout", () => {
    const args = buildFfmpegArgs(spec, { progress: true });
    expect(args).toContain("-nostdin");
    expect(after(args, "-loglevel")).toBe("error");
    expect(after(args, "-progress")).toBe("pipe:1");
    expect(args).toContain("-stats_period");
  });

  it("caps threads for the decoder, the encoder and filters", () => {
    const args = buildFfmpegArgs(spec, { threads: 2 });
    const input = args.indexOf("-i");
    // -threads before -i applies to the decoder, before the output path to the encoder.
    expect(args.slice(0, input)).toEqual(expect.arrayContaining(["-threads", "2"]));
    expect(args.slice(input + 2)).toEqual(["-threads", "2", "-q:v", "3", "/tmp/out/%06d.jpg"]);
    expect(after(args, "-filter_threads")).toBe("2");
  });

  it("leaves an explicit -threads alone", () => {
    const args = buildFfmpegArgs({ inputs: [{ path: "/a", options: ["-threads", "1"] }], outputs: [{ path: "/b" }] }, { threads: 4 });
    expect(args.slice(0, args.indexOf("-i")).filter((a) => a === "-threads")).toHaveLength(1);
    expect(after(args, "-threads")).toBe("1");
  });

  it("turns relative paths absolute so a name like -evil.mp4 is not read as an option", () => {
    const args = buildFfmpegArgs({ inputs: [{ path: "-evil.mp4" }], outputs: [{ path: "out.jpg" }] });
    expect(after(args, "-i").startsWith("/")).toBe(true);
    expect(args.at(-1)!.startsWith("/")).toBe(true);
    expect(buildFfprobeArgs("-x.mp4", ["-show_format"]).at(-1)!.startsWith("/")).toBe(true);
  });
});

describe("withNice / formatCommand", () => {
  it("prefixes nice -n N and keeps the tool's own arguments", () => {
    expect(withNice("ffmpeg", ["-i", "a"], 10)).toEqual({ file: "nice", args: ["-n", "10", "ffmpeg", "-i", "a"] });
    expect(withNice("ffmpeg", ["-i", "a"], 0)).toEqual({ file: "ffmpeg", args: ["-i", "a"] });
    expect(withNice("ffmpeg", [], 99).args.slice(0, 2)).toEqual(["-n", "19"]);
  });

  it("quotes what a shell would split", () => {
    expect(formatCommand("ffmpeg", ["-vf", "select='not(mod(n,4))'", "/a b/c.jpg"])).toBe(
      "ffmpeg -vf 'select='\\''not(mod(n,4))'\\''' '/a b/c.jpg'",
    );
  });
});

describe("classifyFailure", () => {
  it("tells deterministic input failures from crashes, kills and other exits", () => {
    expect(classifyFailure({ exitCode: 1, stderr: "x.mp4: Invalid data found when processing input" })).toBe("invalid_data");
    expect(classifyFailure({ exitCode: 1, stderr: "[mov] moov atom not found" })).toBe("invalid_data");
    expect(classifyFailure({ signal: "SIGSEGV", stderr: "" })).toBe("crashed");
    expect(classifyFailure({ signal: "SIGTERM", stderr: "", killedFor: "timeout" })).toBe("timeout");
    expect(classifyFailure({ exitCode: 255, stderr: "", killedFor: "stalled" })).toBe("stalled");
    expect(classifyFailure({ exitCode: 1, stderr: "av_interleaved_write_frame(): No space left on device" })).toBe("disk_full");
    expect(classifyFailure({ exitCode: 1, stderr: "Conversion failed!" })).toBe("failed");
    expect(classifyFailure({ stderr: "", spawnErrorCode: "ENOENT" })).toBe("spawn_failed");
  });
});

describe("buildExtractSpec", () => {
  const base: ExtractSpecInput = {
    input: "/job/original",
    probe: { frameCount: 480, videoStreamIndex: 0, pixelFormat: "yuv420p", colorRange: "tv", timeBase: "1/15360" },
    framesDir: "/job/out/frames",
    stripPath: "/job/out/strip.jpg",
    format: "jpg",
    quality: 3,
    strip: { count: 20, height: 90 },
  };
  const argsOf = (s: ExtractSpecInput) => buildFfmpegArgs(buildExtractSpec(s));

  it("writes one image per decoded frame, atomically, numbered from 1", () => {
    const args = argsOf(base);
    expect(after(args, "-fps_mode")).toBe("passthrough");
    expect(after(args, "-atomic_writing")).toBe("1");
    expect(after(args, "-start_number")).toBe("1");
    expect(args).toContain("/job/out/frames/%06d.jpg");
    expect(after(args, "-q:v")).toBe("3");
  });

  it("maps limited-range YUV to full range once, with a lookup table (ITU-R BT.601 levels 16-235 / 16-240)", () => {
    expect(after(argsOf(base), "-filter_complex")).toContain("lutyuv=y='clip(round((val-16)*255/219),0,255)'");
    const already = { ...base, probe: { ...base.probe, pixelFormat: "yuvj420p", colorRange: "pc" } };
    expect(after(argsOf(already), "-filter_complex")).not.toContain("lutyuv");
    expect(after(argsOf({ ...base, format: "webp" }), "-filter_complex")).not.toContain("lutyuv");
  });

  it("never adds its own rotation (ffmpeg's autorotate turns the picture, once)", () => {
    const args = argsOf(base);
    expect(args.join(" ")).not.toMatch(/transpose|rotate|noautorotate/);
  });

  it("picks strip frames evenly and exactly as many as the strip holds", () => {
    const fc = after(argsOf(base), "-filter_complex");
    expect(fc).toContain("select='not(mod(n,24))*lt(n,480)'");
    expect(fc).toContain("tile=20x1");
    const short = after(argsOf({ ...base, probe: { ...base.probe, frameCount: 7 } }), "-filter_complex");
    expect(short).toContain("tile=7x1");
  });

  it("without a strip maps the video stream straight to the frames", () => {
    const args = argsOf({ ...base, stripPath: null, probe: { ...base.probe, videoStreamIndex: 2 } });
    expect(after(args, "-map")).toBe("0:2");
    expect(args).not.toContain("-filter_complex");
  });

  it("encodes WebP with libwebp at a quality taken from the same 1-31 scale", () => {
    const args = argsOf({ ...base, format: "webp" });
    expect(after(args, "-c:v")).toBe("libwebp");
    expect(after(args, "-quality")).toBe(String(webpQuality(3)));
    expect([webpQuality(1), webpQuality(3), webpQuality(31)]).toEqual([100, 96, 40]);
  });

  it("names frames by index with six digits", () => {
    expect(frameFileName(1, "jpg")).toBe("000001.jpg");
    expect(frameFileName(1234567, "webp")).toBe("1234567.webp");
  });
});
