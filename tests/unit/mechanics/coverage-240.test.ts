// Issue 16: at 240 fps (a phone's slow motion) every result's 95 % interval holds the truth in
// ≥ 93 % of 240 seeded noisy copies of the synthetic shot. Method and sources:
// tests/unit/mechanics/support/coverage.ts.
import { describeCoverage, type CoverageConfig } from "./support/coverage";

const configs: CoverageConfig[] = [
  { name: "240 fps, scale bar, 0.5 px", shot: { captureFps: 240, frames: 150, noisePx: 0.5 } },
  { name: "240 fps, scale bar, 1 px", shot: { captureFps: 240, frames: 150, noisePx: 1 } },
  {
    name: "240 fps, plane, blade accelerating 200 m/s², events between frames",
    shot: { captureFps: 240, frames: 150, noisePx: 0.5, calibration: "plane", bladeAccelMps2: 200 },
    eventsBetweenFrames: true,
  },
];

describeCoverage("coverage of the 95 % intervals at 240 fps", configs);
