// The canvas tools as state machines, driven by plain pointer events: no DOM, no Konva.
import { describe, expect, it } from "vitest";
import { CLICK_SLOP_PX, idle, step, type Handle, type PointerInput, type ToolContext, type ToolState } from "@/features/digitise/model/tools/pointer-tool";

const handle: Handle = { kind: "mark", landmark: "puck", frame: 10 };
// Zoomed 4× and panned: frame (x, y) is at screen (50 + 4x, 20 + 4y).
const ctx = (over: Partial<ToolContext> = {}): ToolContext => ({
  view: { zoom: 4, panX: 50, panY: 20 },
  frameSize: { width: 640, height: 360 },
  readOnly: false,
  hit: (s) => (Math.hypot(s[0] - 450, s[1] - 420) < 10 ? handle : null), // the puck mark sits at frame (100, 100)
  handlePosition: () => [100, 100],
  ...over,
});

function run(events: PointerInput[], c = ctx()) {
  let s: ToolState = idle;
  const effects = [];
  for (const e of events) {
    const r = step(s, e, c);
    s = r.state;
    effects.push(...r.effects);
  }
  return { state: s, effects };
}
const down = (x: number, y: number, button = 0): PointerInput => ({ type: "down", screen: [x, y], button });
const move = (x: number, y: number): PointerInput => ({ type: "move", screen: [x, y] });
const up = (x: number, y: number): PointerInput => ({ type: "up", screen: [x, y] });

describe("pointer tool", () => {
  it("a click on empty picture is one click effect in frame pixels, at the press position", () => {
    const r = run([down(250, 220), move(251, 221), up(252, 222)]);
    expect(r.state).toEqual(idle);
    expect(r.effects).toEqual([{ type: "click", at: [50, 50] }]);
  });

  it("sub-pixel: the frame point under the pointer is kept to fractions of a pixel", () => {
    const r = run([down(51, 23), up(51, 23)]);
    expect(r.effects).toEqual([{ type: "click", at: [0.25, 0.75] }]);
  });

  it("moving past the slop turns the press into a pan, with every delta in screen px", () => {
    const r = run([down(200, 200), move(200 + CLICK_SLOP_PX + 1, 200), move(220, 210), up(220, 210)]);
    expect(r.effects).toEqual([
      { type: "pan", dx: CLICK_SLOP_PX + 1, dy: 0 },
      { type: "pan", dx: 20 - CLICK_SLOP_PX - 1, dy: 10 },
    ]);
    expect(r.effects.some((e) => e.type === "click")).toBe(false);
  });

  it("the secondary button pans straight away", () => {
    const r = run([down(100, 100, 2), move(101, 100), up(101, 100)]);
    expect(r.effects).toEqual([{ type: "pan", dx: 1, dy: 0 }]);
  });

  it("dragging a handle previews and then commits one move, keeping the grab offset", () => {
    // Grab 2 screen px right of the mark's centre (450, 420), drag by (+40, −20) screen px = (+10, −5) frame px.
    const r = run([down(452, 420), move(470, 410), move(492, 400), up(492, 400)]);
    expect(r.effects[0]).toEqual({ type: "preview", handle, at: [104.5, 97.5] });
    expect(r.effects.at(-2)).toEqual({ type: "endPreview" });
    expect(r.effects.at(-1)).toEqual({ type: "move", handle, from: [100, 100], to: [110, 95] });
    expect(r.effects.filter((e) => e.type === "move")).toHaveLength(1);
  });

  it("pressing and releasing on a handle without moving selects it (no edit)", () => {
    expect(run([down(450, 420), up(450, 420)]).effects).toEqual([{ type: "select", handle }]);
  });

  it("cancel in the middle of a drag drops the preview and edits nothing", () => {
    const r = run([down(450, 420), move(480, 420), { type: "cancel", screen: [480, 420] }]);
    expect(r.state).toEqual(idle);
    expect(r.effects.at(-1)).toEqual({ type: "endPreview" });
    expect(r.effects.some((e) => e.type === "move")).toBe(false);
  });

  it("read-only: clicks place nothing and handles cannot be grabbed, but the view still pans", () => {
    const c = ctx({ readOnly: true });
    expect(run([down(250, 220), up(250, 220)], c).effects).toEqual([]);
    expect(run([down(450, 420), move(470, 420), up(470, 420)], c).effects).toEqual([{ type: "pan", dx: 20, dy: 0 }]);
  });
});
