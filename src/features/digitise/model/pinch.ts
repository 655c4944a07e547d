import { dist, MAX_ZOOM, MIN_ZOOM, toFrame, type Vec2, type View } from "./viewport";

// Two fingers on the picture zoom and pan it together: the frame point that was under the middle
// of the two fingers when they landed stays under their middle, and the zoom follows the change
// in the distance between them. Pure, so it is tested without a touch screen.

export interface Pinch {
  view: View;
  a: Vec2;
  b: Vec2;
}

const mid = (a: Vec2, b: Vec2): Vec2 => [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];

/** The view for the fingers now at `a` and `b`, from where they started. */
export function pinchView(start: Pinch, a: Vec2, b: Vec2): View {
  const d0 = Math.max(1, dist(start.a, start.b));
  const zoom = Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, start.view.zoom * (dist(a, b) / d0)));
  const [fx, fy] = toFrame(start.view, mid(start.a, start.b));
  const [mx, my] = mid(a, b);
  return { zoom, panX: mx - fx * zoom, panY: my - fy * zoom };
}
