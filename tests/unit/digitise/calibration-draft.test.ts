// Calibration drafts: only a complete, valid one is ready to save; the words come from the engine.
import { describe, expect, it } from "vitest";
import { checkDraft, draftFromClip, scaleOf } from "@/features/digitise/model/calibration-draft";

const frame = { width: 1280, height: 720 };

describe("calibration drafts", () => {
  it("a scale bar needs both ends and a positive length", () => {
    expect(checkDraft({ type: "scaleBar", a: [1, 1], b: null, length: 76.2, unit: "mm" }, frame)).toMatchObject({ state: "incomplete" });
    expect(checkDraft({ type: "scaleBar", a: [1, 1], b: [41, 1], length: 0, unit: "mm" }, frame)).toMatchObject({ state: "invalid", message: /above 0/ });
    expect(checkDraft({ type: "scaleBar", a: [5, 5], b: [5.2, 5], length: 76.2, unit: "mm" }, frame)).toMatchObject({ state: "invalid", message: /identical/ });
  });
  it("a length in inches is stored in mm with its unit (1 in = 25.4 mm exactly, NIST SP 811 B)", () => {
    const r = checkDraft({ type: "scaleBar", a: [0, 0], b: [100, 0], length: 3, unit: "in" }, frame);
    expect(r.state).toBe("ready");
    if (r.state !== "ready") return;
    expect(r.calibration).toMatchObject({ lengthUnit: "in" });
    expect(scaleOf(r.calibration)).toBeCloseTo(0.762, 12);
    expect(draftFromClip(r.calibration)).toEqual({ type: "scaleBar", a: [0, 0], b: [100, 0], length: 3, unit: "in" });
  });
  it("a plane needs 4 points, each with its world position, not on one line", () => {
    const pts = [[100, 100], [300, 100], [300, 300], [100, 300]] as [number, number][];
    expect(checkDraft({ type: "plane", points: pts.slice(0, 3).map((image) => ({ image, world: [0, 0] })) }, frame)).toMatchObject({ state: "incomplete", message: /1 more point/ });
    expect(checkDraft({ type: "plane", points: pts.map((image) => ({ image, world: null })) }, frame)).toMatchObject({ state: "incomplete", message: /point 1/ });
    const world = [[0, 0], [1000, 0], [1000, 1000], [0, 1000]] as [number, number][];
    expect(checkDraft({ type: "plane", points: pts.map((image, i) => ({ image, world: world[i] })) }, frame).state).toBe("ready");
    const line = [[100, 100], [200, 100], [300, 100], [400, 100]] as [number, number][];
    expect(checkDraft({ type: "plane", points: line.map((image, i) => ({ image, world: world[i] })) }, frame)).toMatchObject({ state: "invalid", message: /one line/ });
  });
  it("points off the picture are refused", () => {
    expect(checkDraft({ type: "scaleBar", a: [0, 0], b: [1281, 0], length: 10, unit: "mm" }, frame)).toMatchObject({ state: "invalid", message: /outside the frame/ });
  });
});
