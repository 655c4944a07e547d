import { dist, toFrame, type Vec2, type View } from "../viewport";
import type { Landmark } from "@shared/schemas/shots";

// Every canvas tool is one small state machine over pointer events, in frame coordinates:
//
//   idle ──down on a handle──▶ holding ──moves──▶ dragging ──up──▶ idle (commit the move)
//     │                           └────up──────▶ idle (select the handle)
//     ├──down on empty────────▶ pressing ──moves past the slop──▶ panning ──up──▶ idle
//     │                           └────up──────▶ idle (the tool's click: place / add a point)
//     └──down with the middle or right button, or with Alt held──▶ panning
//
// No DOM: the canvas hands in pointer positions and a hit test; the machine answers with effects
// that the store applies. That keeps every tool testable in plain Node.

/** Something on the canvas that can be grabbed and moved. */
export type Handle =
  | { kind: "mark"; landmark: Landmark; frame: number }
  | { kind: "scaleBar"; end: "a" | "b" }
  | { kind: "plane"; index: number };

export interface PointerInput {
  type: "down" | "move" | "up" | "cancel";
  /** Stage position in CSS px. */
  screen: Vec2;
  /** 0 main, 1 middle, 2 secondary. */
  button?: number;
  /** Alt held (Space plays and pauses): drag pans whatever is under the pointer, marks included. */
  panKey?: boolean;
  /** A finger rather than a mouse or pen: a tap wobbles more before it counts as a drag. */
  touch?: boolean;
}

export interface ToolContext {
  view: View;
  frameSize: { width: number; height: number };
  /** The handle under a stage position (the tool decides which handles it offers); a finger grabs from farther. */
  hit(screen: Vec2, touch?: boolean): Handle | null;
  /** Where the handle is now, in frame px. */
  handlePosition(h: Handle): Vec2 | null;
  readOnly: boolean;
}

export type ToolEffect =
  | { type: "click"; at: Vec2 }
  | { type: "preview"; handle: Handle; at: Vec2 }
  | { type: "move"; handle: Handle; from: Vec2; to: Vec2 }
  | { type: "select"; handle: Handle }
  | { type: "endPreview" }
  | { type: "pan"; dx: number; dy: number };

export type ToolState =
  | { mode: "idle" }
  | { mode: "pressing"; start: Vec2; last: Vec2 }
  | { mode: "panning"; last: Vec2 }
  | { mode: "holding"; handle: Handle; start: Vec2; grab: Vec2; origin: Vec2 }
  | { mode: "dragging"; handle: Handle; grab: Vec2; origin: Vec2; at: Vec2 };

/** Screen px a press may wander and still count as a click (a finger wobbles more than a mouse). */
export const CLICK_SLOP_PX = 4;
export const TOUCH_SLOP_PX = 10;
const slop = (ev: PointerInput) => (ev.touch ? TOUCH_SLOP_PX : CLICK_SLOP_PX);

export const idle: ToolState = { mode: "idle" };

/** Cursor the canvas should show for a state and what is under the pointer. */
export function cursorFor(s: ToolState, hovering: Handle | null, readOnly: boolean): string {
  if (s.mode === "panning") return "grabbing";
  if (s.mode === "dragging" || s.mode === "holding") return "move";
  if (hovering && !readOnly) return "move";
  return readOnly ? "grab" : "crosshair";
}

export function step(s: ToolState, ev: PointerInput, ctx: ToolContext): { state: ToolState; effects: ToolEffect[] } {
  const none = (state: ToolState) => ({ state, effects: [] as ToolEffect[] });
  if (ev.type === "cancel") {
    return { state: idle, effects: s.mode === "dragging" ? [{ type: "endPreview" }] : [] };
  }
  switch (s.mode) {
    case "idle": {
      if (ev.type !== "down") return none(s);
      if (ev.button === 1 || ev.button === 2 || ev.panKey) return none({ mode: "panning", last: ev.screen });
      const h = ctx.readOnly ? null : ctx.hit(ev.screen, ev.touch);
      const origin = h ? ctx.handlePosition(h) : null;
      if (h && origin) {
        const grab = toFrame(ctx.view, ev.screen);
        return none({ mode: "holding", handle: h, start: ev.screen, grab: [grab[0] - origin[0], grab[1] - origin[1]], origin });
      }
      return none({ mode: "pressing", start: ev.screen, last: ev.screen });
    }
    case "pressing": {
      if (ev.type === "move") {
        if (dist(ev.screen, s.start) <= slop(ev)) return none({ ...s, last: ev.screen });
        return { state: { mode: "panning", last: ev.screen }, effects: [{ type: "pan", dx: ev.screen[0] - s.start[0], dy: ev.screen[1] - s.start[1] }] };
      }
      if (ev.type === "up") {
        // The click lands where the button was pressed: a tremor on release must not move it.
        return { state: idle, effects: ctx.readOnly ? [] : [{ type: "click", at: toFrame(ctx.view, s.start) }] };
      }
      return none(s);
    }
    case "panning": {
      if (ev.type === "move") return { state: { mode: "panning", last: ev.screen }, effects: [{ type: "pan", dx: ev.screen[0] - s.last[0], dy: ev.screen[1] - s.last[1] }] };
      if (ev.type === "up") return none(idle);
      return none(s);
    }
    case "holding": {
      if (ev.type === "move") {
        if (dist(ev.screen, s.start) <= slop(ev)) return none(s);
        const at = grabbed(ctx.view, ev.screen, s.grab);
        return { state: { mode: "dragging", handle: s.handle, grab: s.grab, origin: s.origin, at }, effects: [{ type: "preview", handle: s.handle, at }] };
      }
      if (ev.type === "up") return { state: idle, effects: [{ type: "select", handle: s.handle }] };
      return none(s);
    }
    case "dragging": {
      if (ev.type === "move") {
        const at = grabbed(ctx.view, ev.screen, s.grab);
        return { state: { ...s, at }, effects: [{ type: "preview", handle: s.handle, at }] };
      }
      if (ev.type === "up") {
        const at = grabbed(ctx.view, ev.screen, s.grab);
        return { state: idle, effects: [{ type: "endPreview" }, { type: "move", handle: s.handle, from: s.origin, to: at }] };
      }
      return none(s);
    }
  }
}

/** The handle keeps the offset at which it was grabbed, so it does not jump under the pointer. */
function grabbed(v: View, screen: Vec2, grab: Vec2): Vec2 {
  const f = toFrame(v, screen);
  return [f[0] - grab[0], f[1] - grab[1]];
}
