// Issue 16: at 3,200 fps (a lab camera) every result's 95 % interval holds the truth in ≥ 93 % of
// 240 seeded noisy copies of the synthetic shot. Method and sources:
// tests/unit/mechanics/support/coverage.ts.
import { describeCoverage, type CoverageConfig } from "./support/coverage";

const configs: CoverageConfig[] = [
  { name: "3,200 fps, plane, 0.5 px", shot: { captureFps: 3200, frames: 600, noisePx: 0.5, calibration: "plane" } },
  { name: "3,200 fps, scale bar, 1 px", shot: { captureFps: 3200, frames: 600, noisePx: 1 } },
  { name: "3,200 fps, blade accelerating 200 m/s², events between frames", shot: { captureFps: 3200, frames: 600, noisePx: 0.5, bladeAccelMps2: 200 }, eventsBetweenFrames: true },
];

describeCoverage("coverage of the 95 % intervals at 3,200 fps", configs);
