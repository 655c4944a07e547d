// Every time the pages show or use comes from the clip's own frame clock (decision 135), checked on
// variable-frame-rate footage made by ffmpeg: a phone-like clip whose frame steps wander ±30 %
// around 240 fps, with frames 100–102 dropped. Its times go through the probe (ffprobe packet
// times, the frame-clock analysis) as an upload's do; the truth is the timestamps we wrote.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import path from "node:path";
import { probe } from "../../../server/media";
import { shotFrameTimes, captureTimeOf } from "../../../shared/schemas/clips";
import { frameClock } from "../../../shared/frame-clock";
import type { ShotReadout } from "../../../shared/schemas/readout";
import { frameAtChartTime } from "@/features/readout/components/ShotCharts";
import { frameAtStep, syncPlan, type ClipClock } from "@/features/compare/lib/sync";
import { msSince, msSinceFirst } from "@/features/digitise/model/timing";
import { ffmpeg, tempDir, testMedia } from "./helpers";

const FPS = 240;
const FRAMES = 200;
/** Frame n (0-based, before the drop) at (n + 0.3·sin n) / 240 s: steps between 0.4 and 1.6 frames. */
const slotOf = (n: number) => (n + 0.3 * Math.sin(n)) / FPS;
/** The frames kept: 100–102 dropped. */
const kept = Array.from({ length: FRAMES }, (_, n) => n).filter((n) => n < 100 || n > 102);
/** True capture time of stored frame f (counted from 1), seconds from frame 1. */
const truth = (f: number) => slotOf(kept[f - 1]) - slotOf(kept[0]);

let cleanup: () => Promise<void>;
let times: number[];

beforeAll(async () => {
  const t = await tempDir("vfr");
  cleanup = t.cleanup;
  const file = path.join(t.dir, "phone-vfr.mp4");
  const graph = `testsrc2=size=160x96:rate=${FPS},trim=end_frame=${FRAMES},select='not(between(n\\,100\\,102))',settb=1/90000,setpts='(N+gte(N\\,100)*3+0.3*sin(N+gte(N\\,100)*3))/${FPS}/TB'`;
  await ffmpeg(["-f", "lavfi", "-i", graph, "-fps_mode", "passthrough", "-video_track_timescale", "90000", "-c:v", "libx264", "-preset", "ultrafast", "-bf", "0", file]);
  const p = await probe(testMedia(), file);
  expect(p.timing.clock).toBe("uneven");
  expect(p.frameCount).toBe(kept.length);
  times = p.packetTimes;
}, 60_000);
afterAll(() => cleanup?.());

describe("the frame clock on variable-frame-rate footage", () => {
  it("the probe's times are the ones written, to the container's clock", () => {
    for (let f = 1; f <= kept.length; f++) expect(times[f - 1]).toBeCloseTo(truth(f), 4);
  });

  it("time of frame i and frame at time t agree with the truth, across the gap", () => {
    const clock = frameClock({ firstFrame: 1, seconds: times }, FPS);
    expect(clock.ms(120, 90)).toBeCloseTo((truth(120) - truth(90)) * 1000, 1);
    for (let f = 1; f <= kept.length; f++) expect(clock.frameAt(truth(f), 1, kept.length)).toBe(f);
  });

  it("Digitise: time since the clip's first frame and between events", () => {
    const shot = shotFrameTimes(times, FPS, FPS, 50, 180)!;
    const clock = frameClock(shot, FPS);
    const startMs = captureTimeOf(times, FPS, FPS, 50) * 1000;
    expect(msSinceFirst(150, { clock, startMs, frameStart: 50 })).toBeCloseTo(truth(150) * 1000, 1);
    // Puck strike at 95, release at 110: the dropped frames lie between.
    expect(msSince(110, 95, clock)).toBeCloseTo((truth(110) - truth(95)) * 1000, 1);
  });

  it("the readout chart: a time from puck strike opens the frame taken then", () => {
    const r = {
      shot: { frameStart: 50, frameEnd: 180 },
      clip: { captureFps: FPS },
      events: [{ key: "puckStrike", frame: 95 }],
      frameTimes: shotFrameTimes(times, FPS, FPS, 50, 180),
    } as unknown as ShotReadout;
    for (const f of [60, 99, 100, 110, 150]) expect(frameAtChartTime(r, (truth(f) - truth(95)) * 1000)).toBe(f);
  });

  it("side by side: the uneven clip shows its frame nearest each moment, against an even 1,000 fps clip", () => {
    const vfr: ClipClock = { fps: FPS, strike: 95, first: 50, last: 180, times: shotFrameTimes(times, FPS, FPS, 50, 180) };
    const even: ClipClock = { fps: 1000, strike: 200, first: 1, last: 400 };
    const p = syncPlan(vfr, even);
    for (let k = -150; k <= 300; k += 7) {
      const tS = (k * p.stepMs) / 1000 + truth(95);
      let best = 50;
      for (let f = 50; f <= 180; f++) if (Math.abs(truth(f) - tS) < Math.abs(truth(best) - tS)) best = f;
      const got = frameAtStep(vfr, p, k);
      if (tS >= truth(50) && tS <= truth(180)) expect(got.frame).toBe(best);
      expect(got.tMs).toBeCloseTo((truth(got.frame) - truth(95)) * 1000, 1);
    }
  });
});
