// Test 3 of issue 5: a plane calibration from image points made by a known projective map of a
// known rectangle. Source: 2D homography by normalised DLT (Hartley & Zisserman, Multiple View
// Geometry, 2nd ed., ch. 4) [P]; the map and the motion are known by construction.
import { describe, expect, it } from "vitest";
import { applyHomography, computeShot, makeCalibration, validateCalibration, type Mat3, type Mark, type Vec2 } from "../../../shared/mechanics/index";

/** World mm → image px: a camera looking obliquely at the plane of the shot. */
const WORLD_TO_IMAGE: Mat3 = [0.42, 0.06, 180, 0.03, -0.33, 620, 0.00012, 0.00004, 1];
const toImage = (w: Vec2) => applyHomography(WORLD_TO_IMAGE, w[0], w[1]);

// A 2,000 × 1,000 mm rectangle (e.g. tape on the boards) as the calibration layout.
const CORNERS: Vec2[] = [
  [0, 0],
  [2000, 0],
  [2000, 1000],
  [0, 1000],
];

const FPS = 1000;
const SPEED_MPS = 27.5;
const DIR = (12 * Math.PI) / 180;

function puckTrack(): Mark[] {
  const marks: Mark[] = [];
  for (let f = 0; f < 40; f++) {
    const s = f < 20 ? 0 : (SPEED_MPS * (f - 20)) / FPS * 1000;
    const [x, y] = toImage([300 + s * Math.cos(DIR), 150 + s * Math.sin(DIR)]);
    marks.push([f, x, y]);
  }
  return marks;
}

describe("plane calibration by homography", () => {
  const points = CORNERS.map((w) => ({ image: toImage(w), world: w }));

  it("maps points inside the rectangle back to their world position (4 corners)", () => {
    const cal = makeCalibration({ type: "plane", points });
    for (const w of [[500, 250], [1700, 800], [1000, 500]] as Vec2[]) {
      const back = cal.toWorld(toImage(w));
      expect(Math.hypot(back[0] - w[0], back[1] - w[1])).toBeLessThan(1e-6);
    }
    expect(cal.mmPerPx).toBeUndefined();
    expect(cal.mmPerPxAt(toImage([1000, 500]))).toBeGreaterThan(0);
  });

  it("recovers the puck's world speed within 0.5 % (4 corners, and 6 points)", () => {
    const six = [...points, ...([[1000, 0], [1000, 1000]] as Vec2[]).map((w) => ({ image: toImage(w), world: w }))];
    for (const pts of [points, six]) {
      const r = computeShot({ captureFps: FPS, calibration: { type: "plane", points: pts }, tracks: { puck: puckTrack() }, events: { puckStrike: 15, release: 20 } });
      expect(Math.abs(r.puckExitSpeed.valueMps - SPEED_MPS) / SPEED_MPS).toBeLessThan(0.005);
      expect(r.calibration.type).toBe("plane");
    }
  });

  it("the same image speed read with one scale bar is wrong under perspective (why the plane exists)", () => {
    // Scale bar along the rectangle's bottom edge: right only where that edge is.
    const a = toImage([0, 0]);
    const b = toImage([2000, 0]);
    const r = computeShot({ captureFps: FPS, calibration: { type: "scaleBar", a, b, lengthMm: 2000 }, tracks: { puck: puckTrack() }, events: { puckStrike: 15, release: 20 } });
    expect(Math.abs(r.puckExitSpeed.valueMps - SPEED_MPS) / SPEED_MPS).toBeGreaterThan(0.005);
  });

  it("rejects fewer than 4 points, three in a row, repeated points and a folded order", () => {
    expect(validateCalibration({ type: "plane", points: points.slice(0, 3) })).toMatch(/at least 4 points \(got 3\)/);
    const inRow = [points[0], points[1], { image: toImage([1000, 0]), world: [1000, 0] as Vec2 }, points[3]];
    expect(validateCalibration({ type: "plane", points: inRow })).toMatch(/lie on one line/);
    expect(validateCalibration({ type: "plane", points: [points[0], points[0], points[2], points[3]] })).toMatch(/same image position/);
    const crossed = [points[0], points[1], { image: points[2].image, world: points[3].world }, { image: points[3].image, world: points[2].world }];
    expect(validateCalibration({ type: "plane", points: crossed })).toMatch(/orders differ/);
    const line = Array.from({ length: 6 }, (_, i) => ({ image: [10 * i, 5 * i] as Vec2, world: [100 * i, 7 * i] as Vec2 }));
    expect(validateCalibration({ type: "plane", points: line })).toMatch(/one line/);
    expect(validateCalibration({ type: "plane", points })).toBeNull();
  });
});
