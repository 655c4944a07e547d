import type { ShotEvents } from "../schemas/shot-document";
import { frameStepS, type TimeBase } from "./time-base";

// Load time (ice strike → puck strike) and contact time (puck strike → release) with the marked
// events' own uncertainty. Each event is known to ±e frames — ±a and ±b in time, a frame being its
// own length on the clip's clock — uniformly (GUM 4.3.7). A time between two events then spreads
// as the sum of two such uniforms, a symmetric trapezoid of half-width a + b (a triangle when a = b;
// GUM 4.3.9): u = √((a² + b²)/3), and its 95 % points are exact (below), so no trials are needed.

export interface TimeSpread {
  u: number;
  interval95: [number, number];
}

/**
 * Spread of a time between two events known to ±aMs and ±bMs. For X + Y with X, Y uniform on
 * ±a ≥ ±b, P(|X + Y| > s) = (a + b − s)²/(4ab) on the sloping flanks, so the 95 % half-width is
 * a + b − √(0.2·ab) (1.553a for a = b); when a > 20b it lies on the flat top, 0.95a + 0.05b.
 */
export function betweenEvents(valueMs: number, aMs: number, bMs: number): TimeSpread {
  const [a, b] = aMs >= bMs ? [aMs, bMs] : [bMs, aMs];
  const half = a === 0 ? 0 : a > 20 * b ? 0.95 * a + 0.05 * b : a + b - Math.sqrt(0.2 * a * b);
  return { u: Math.sqrt((a * a + b * b) / 3), interval95: [valueMs - half, valueMs + half] };
}

export function eventTiming(events: ShotEvents, e: number, time: TimeBase): { load: TimeSpread | null; contact: TimeSpread } {
  const ms = (a: number, b: number) => time.between(a, b) * 1000;
  // ±e frames of an event, in ms: the frame's own length on the clip's clock.
  const spread = (f: number) => e * frameStepS(time, f) * 1000;
  return {
    load: events.iceStrike !== undefined ? betweenEvents(ms(events.iceStrike, events.puckStrike), spread(events.iceStrike), spread(events.puckStrike)) : null,
    contact: betweenEvents(ms(events.puckStrike, events.release), spread(events.puckStrike), spread(events.release)),
  };
}
