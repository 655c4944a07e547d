// The Digitise store: marks in frame pixels whatever the view, undo/redo of every edit, refusals
// at the point of entry, events and calibration drafts.
import { describe, expect, it } from "vitest";
import { DigitiseStore, type DigitiseDoc } from "@/features/digitise/model/store";
import { toScreen } from "@/features/digitise/model/viewport";

const emptyDoc = (): DigitiseDoc => ({ marks: {}, events: {}, calibration: null });
function makeStore(over: Partial<ConstructorParameters<typeof DigitiseStore>[0]> = {}) {
  const s = new DigitiseStore({ readOnly: false, frameSize: { width: 1280, height: 720 }, frameStart: 1, frameEnd: 300, captureFps: 3200, doc: emptyDoc(), ...over });
  s.setStage(1000, 600);
  return s;
}
const click = (s: DigitiseStore, frameX: number, frameY: number) => {
  const p = toScreen(s.getState().view, [frameX, frameY]);
  s.pointer({ type: "down", screen: p, button: 0 });
  s.pointer({ type: "up", screen: p, button: 0 });
};

describe("marks", () => {
  it("stores the clicked frame pixel whatever the zoom and pan", () => {
    const s = makeStore();
    s.wheel([700, 100], -600); // zoom in at a corner
    s.pointer({ type: "down", screen: [500, 300], button: 2 });
    s.pointer({ type: "move", screen: [380, 250] });
    s.pointer({ type: "up", screen: [380, 250] });
    expect(s.getState().view.zoom).toBeGreaterThan(1.5);
    click(s, 640.37, 200.81);
    const [m] = s.getState().doc.marks.puck!;
    expect(m[0]).toBe(1);
    expect(m[1]).toBeCloseTo(640.37, 9);
    expect(m[2]).toBeCloseTo(200.81, 9);
  });

  it("a click outside the frame is refused with a message and stores nothing", () => {
    const s = makeStore();
    click(s, -3, 100);
    expect(s.getState().doc.marks.puck).toBeUndefined();
    expect(s.getState().notice?.text).toMatch(/outside the frame \(0–1280 × 0–720 px\)/);
    expect(s.getState().canUndo).toBe(false);
  });

  it("auto-advance moves to the next frame after each click, not past the shot's end", () => {
    const s = makeStore({ frame: 299 });
    s.setAutoAdvance(true);
    click(s, 10, 10);
    click(s, 11, 11);
    click(s, 12, 12);
    expect(s.getState().doc.marks.puck!.map((m) => m[0])).toEqual([299, 300]);
    expect(s.getState().frame).toBe(300);
  });

  it("dragging a mark corrects it in one undoable step; delete removes it", () => {
    const s = makeStore();
    s.setActiveLandmark("bladeHeel");
    click(s, 100, 100);
    const a = toScreen(s.getState().view, [100, 100]);
    const z = s.getState().view.zoom;
    s.pointer({ type: "down", screen: a, button: 0 });
    s.pointer({ type: "move", screen: [a[0] + 10 * z, a[1]] });
    expect(s.getState().preview?.at[0]).toBeCloseTo(110, 9);
    s.pointer({ type: "up", screen: [a[0] + 20 * z, a[1] + 5 * z] });
    expect(s.getState().doc.marks.bladeHeel![0].slice(1).map((v) => +v.toFixed(9))).toEqual([120, 105]);
    expect(s.getState().preview).toBeNull();
    s.undo();
    expect(s.getState().doc.marks.bladeHeel![0].slice(1)).toEqual([100, 100]);
    s.redo();
    s.deleteMark();
    expect(s.getState().doc.marks.bladeHeel).toEqual([]);
  });

  it("undo and redo walk back and forth through every edit", () => {
    const s = makeStore();
    click(s, 1, 1);
    s.stepBy(1);
    click(s, 2, 2);
    s.toggleEvent("iceStrike");
    const snapshots = [JSON.stringify(s.getState().doc)];
    s.undo();
    snapshots.push(JSON.stringify(s.getState().doc));
    s.undo();
    s.undo();
    expect(s.getState().doc.marks.puck ?? []).toEqual([]);
    expect(s.getState().canUndo).toBe(false);
    s.redo();
    s.redo();
    expect(JSON.stringify(s.getState().doc)).toBe(snapshots[1]);
    s.redo();
    expect(JSON.stringify(s.getState().doc)).toBe(snapshots[0]);
    expect(s.getState().canRedo).toBe(false);
  });

  it("a new edit after undo drops the redo branch", () => {
    const s = makeStore();
    click(s, 1, 1);
    s.undo();
    s.setActiveLandmark("topHand");
    click(s, 5, 5);
    expect(s.getState().canRedo).toBe(false);
    s.redo();
    expect(s.getState().doc.marks.puck).toBeUndefined();
  });

  it("read-only: nothing can be edited, but frames and view still move", () => {
    const s = makeStore({ readOnly: true, doc: { marks: { puck: [[1, 10, 10]] }, events: {}, calibration: null } });
    click(s, 50, 50);
    s.deleteMark("puck", 1);
    s.toggleEvent("release");
    s.stepBy(10);
    expect(s.getState().doc.marks.puck).toEqual([[1, 10, 10]]);
    expect(s.getState().doc.events).toEqual({});
    expect(s.getState().frame).toBe(11);
  });
});

describe("events", () => {
  it("set to the current frame, cleared by setting again, and impossible orders refused", () => {
    const s = makeStore();
    s.goto(100);
    s.toggleEvent("puckStrike");
    s.goto(90);
    expect(s.toggleEvent("release")).toBe(false);
    expect(s.getState().notice?.text).toMatch(/release \(frame 90\) must come after puck strike \(frame 100\)/);
    expect(s.getState().doc.events).toEqual({ puckStrike: 100 });
    s.toggleEvent("iceStrike");
    s.goto(130);
    s.toggleEvent("release");
    expect(s.getState().doc.events).toEqual({ iceStrike: 90, puckStrike: 100, release: 130 });
    s.goto(100);
    s.toggleEvent("puckStrike");
    expect(s.getState().doc.events.puckStrike).toBeUndefined();
  });
});

describe("calibration tools", () => {
  it("the scale bar takes two clicks; a third starts a new bar", () => {
    const s = makeStore();
    s.setTool("scaleBar");
    click(s, 100, 600);
    expect(s.getState().doc.calibration).toMatchObject({ type: "scaleBar", a: [100, 600], b: null, length: 76.2, unit: "mm" });
    click(s, 140, 600);
    expect(s.getState().doc.calibration).toMatchObject({ a: [100, 600], b: [140, 600] });
    click(s, 10, 10);
    expect(s.getState().doc.calibration).toMatchObject({ a: [10, 10], b: null });
    expect(s.getState().doc.marks.puck).toBeUndefined();
  });

  it("plane points are added by click and dragged by their handle", () => {
    const s = makeStore();
    s.setTool("plane");
    for (const p of [[100, 100], [300, 100], [300, 300], [100, 300]]) click(s, p[0], p[1]);
    const c = s.getState().doc.calibration;
    expect(c?.type === "plane" && c.points.map((p) => p.image)).toEqual([[100, 100], [300, 100], [300, 300], [100, 300]]);
    const z = s.getState().view.zoom;
    const h = toScreen(s.getState().view, [300, 300]);
    s.pointer({ type: "down", screen: h, button: 0 });
    s.pointer({ type: "move", screen: [h[0] + 8 * z, h[1]] });
    s.pointer({ type: "up", screen: [h[0] + 8 * z, h[1]] });
    const c2 = s.getState().doc.calibration;
    expect(c2?.type === "plane" && c2.points[2].image[0]).toBeCloseTo(308, 9);
  });
});

describe("view", () => {
  it("wheel zoom keeps the frame point under the pointer still", () => {
    const s = makeStore();
    const anchor: [number, number] = [321, 123];
    const before = s.getState().view;
    const fBefore = [(anchor[0] - before.panX) / before.zoom, (anchor[1] - before.panY) / before.zoom];
    s.wheel(anchor, -300);
    const v = s.getState().view;
    expect((anchor[0] - v.panX) / v.zoom).toBeCloseTo(fBefore[0], 9);
    expect((anchor[1] - v.panY) / v.zoom).toBeCloseTo(fBefore[1], 9);
    s.originalPixels();
    expect(s.getState().view.zoom).toBeCloseTo(1, 12);
    s.fit();
    expect(s.getState().view.zoom).toBeCloseTo(Math.min(976 / 1280, 576 / 720), 12);
  });
});
