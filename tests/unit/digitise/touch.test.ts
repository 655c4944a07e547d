// Touch on the Digitise canvas: a fingertip's tap wobbles more than a mouse click and grabs a
// mark from farther; two fingers pinch-zoom about the point between them.
import { describe, expect, it } from "vitest";
import { pinchView } from "@/features/digitise/model/pinch";
import { hitTest, HIT_RADIUS_PX, TOUCH_HIT_RADIUS_PX } from "@/features/digitise/model/tools/hit";
import { CLICK_SLOP_PX, idle, step, TOUCH_SLOP_PX, type PointerInput, type ToolContext } from "@/features/digitise/model/tools/pointer-tool";
import { toFrame, toScreen, MAX_ZOOM, type Vec2, type View } from "@/features/digitise/model/viewport";

const ctx: ToolContext = { view: { zoom: 2, panX: 10, panY: 10 }, frameSize: { width: 640, height: 360 }, readOnly: false, hit: () => null, handlePosition: () => null };

function tap(wobble: number, touch: boolean) {
  const evs: PointerInput[] = [
    { type: "down", screen: [200, 200], touch },
    { type: "move", screen: [200 + wobble, 200], touch },
    { type: "up", screen: [200 + wobble, 200], touch },
  ];
  let s = idle as ReturnType<typeof step>["state"];
  const effects = [];
  for (const e of evs) {
    const r = step(s, e, ctx);
    s = r.state;
    effects.push(...r.effects);
  }
  return effects.map((e) => e.type);
}

describe("touch taps and grabs", () => {
  it("a finger that wobbles 8 px still places a mark; a mouse that moves 8 px pans", () => {
    expect(CLICK_SLOP_PX).toBeLessThan(8);
    expect(TOUCH_SLOP_PX).toBeGreaterThan(8);
    expect(tap(8, true)).toEqual(["click"]);
    expect(tap(8, false)).toEqual(["pan"]);
    expect(tap(TOUCH_SLOP_PX + 2, true)).toEqual(["pan"]);
  });

  it("a finger grabs a mark 18 px away; a mouse does not", () => {
    const view: View = { zoom: 1, panX: 0, panY: 0 };
    const scene = { tool: "mark" as const, frame: 5, view, marks: { puck: [[5, 100, 100] as [number, number, number]] }, visible: { puck: true, bladeHeel: true, bladeToe: true, bottomHand: true, topHand: true, buttEnd: true }, calibration: null };
    const at: Vec2 = [118, 100];
    expect(18).toBeGreaterThan(HIT_RADIUS_PX);
    expect(18).toBeLessThan(TOUCH_HIT_RADIUS_PX);
    expect(hitTest(scene, at, false)).toBeNull();
    expect(hitTest(scene, at, true)).toEqual({ kind: "mark", landmark: "puck", frame: 5 });
  });
});

describe("pinch zoom", () => {
  const start = { view: { zoom: 0.5, panX: 20, panY: 30 } as View, a: [100, 200] as Vec2, b: [300, 200] as Vec2 };

  it("fingers twice as far apart zoom in twice, keeping the frame point between them in place", () => {
    const v = pinchView(start, [0, 200], [400, 200]);
    expect(v.zoom).toBeCloseTo(1, 12);
    const under = toFrame(start.view, [200, 200]);
    const now = toScreen(v, under);
    expect(now[0]).toBeCloseTo(200, 9);
    expect(now[1]).toBeCloseTo(200, 9);
  });

  it("moving both fingers together pans by the same distance at the same zoom", () => {
    const v = pinchView(start, [130, 180], [330, 180]);
    expect(v.zoom).toBeCloseTo(0.5, 12);
    expect(v.panX).toBeCloseTo(50, 9);
    expect(v.panY).toBeCloseTo(10, 9);
  });

  it("the zoom stays inside the viewer's limits however far the fingers spread", () => {
    expect(pinchView(start, [-1e6, 200], [1e6, 200]).zoom).toBe(MAX_ZOOM);
  });
});
