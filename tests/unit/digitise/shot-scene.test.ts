// The synthetic shot scene: its truth is what the engine measures, and the rendered picture puts
// the puck where the truth says (the Digitise end-to-end tests click on it by that truth).
import { describe, expect, it } from "vitest";
import sharp from "sharp";
import { computeShot } from "@shared/mechanics/compute-shot";
import { shotScene } from "../../../scripts/demo/shot-scene";

describe("synthetic shot scene", () => {
  const { truth, svg } = shotScene({ captureFps: 3200, frames: 240, exitSpeedMps: 31.5, bladeSpeedMps: 21, peakDeflectionMm: 44 });

  it("the engine measures the scene's known speeds and bend from exact marks", () => {
    const r = computeShot({ captureFps: 3200, calibration: truth.scaleBar, pixelErrorPx: 0.01, tracks: truth.tracks, events: truth.events, frameRange: [1, 240] }, { trials: 20 });
    // Straight-line flight at constant speed: the fit is exact (analytic scene, [CP]).
    expect(r.puckExitSpeed.valueMps).toBeCloseTo(31.5, 6);
    expect(Math.abs(r.bladeSpeedAtStrike!.valueMps - 21) / 21).toBeLessThan(0.01);
    expect(Math.abs(r.peakBend!.angleDeg - truth.peakBendDeg)).toBeLessThan(0.2);
    expect(r.loadTimeMs).toBeCloseTo(((truth.events.puckStrike - truth.events.iceStrike) * 1000) / 3200, 9);
  });

  it("every landmark is inside the picture, one mark per frame", () => {
    for (const t of Object.values(truth.tracks)) {
      expect(new Set(t.map((m) => m[0])).size).toBe(t.length);
      for (const [, x, y] of t) {
        expect(x).toBeGreaterThanOrEqual(0);
        expect(y).toBeLessThanOrEqual(truth.height);
      }
    }
    expect(truth.tracks.puck.length).toBeGreaterThan(200);
  });

  it("the rendered puck's dark pixels centre on the truth (librsvg through sharp)", async () => {
    for (const frame of [1, 150]) {
      const { data, info } = await sharp(Buffer.from(svg(frame))).removeAlpha().raw().toBuffer({ resolveWithObject: true });
      let sx = 0, sy = 0, sw = 0;
      for (let y = 0; y < info.height; y++)
        for (let x = 0; x < info.width; x++) {
          const i = (y * info.width + x) * 3;
          const lum = (data[i] + data[i + 1] + data[i + 2]) / 3;
          if (lum < 40) {
            const w = 40 - lum;
            sx += (x + 0.5) * w;
            sy += (y + 0.5) * w;
            sw += w;
          }
        }
      const [, tx, ty] = truth.tracks.puck.find((m) => m[0] === frame)!;
      expect(Math.hypot(sx / sw - tx, sy / sw - ty), `frame ${frame}`).toBeLessThan(0.25);
    }
  });
});
