// The engine's own √(x² + y²) (shared/mechanics/hypot.ts) stands in for Math.hypot on the hot paths
// and must give the very same bits, or stored results would change with the swap. Checked against
// the runtime's own Math.hypot [the reference here: V8's builtin, which Node and Chromium share] on
// seeded pairs across the whole double range — ordinary speeds, tiny and huge magnitudes, random
// bit patterns (subnormals included) — and on every special value.
import seedrandom from "seedrandom";
import { describe, expect, it } from "vitest";
import { hypot } from "../../../shared/mechanics/hypot";

const rng = seedrandom.alea("hypot-bits");
const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);
const kinds: Record<string, () => number> = {
  speeds: () => (rng() - 0.5) * 80,
  small: () => (rng() - 0.5) * 1e-3,
  anyExponent: () => (rng() < 0.05 ? 0 : (rng() - 0.5) * 2 ** (rng() * 2080 - 1080)),
  anyBits: () => {
    words[0] = rng() * 2 ** 32;
    words[1] = rng() * 2 ** 32;
    return bits[0];
  },
};

describe("hypot", () => {
  it("gives Math.hypot's bits for two arguments", () => {
    let compared = 0;
    const mismatches: string[] = [];
    for (const gx of Object.values(kinds))
      for (const gy of Object.values(kinds))
        for (let i = 0; i < 20_000; i++) {
          const x = gx();
          const y = gy();
          if (!Object.is(hypot(x, y), Math.hypot(x, y))) mismatches.push(`${x}, ${y}`);
          compared++;
        }
    expect(compared).toBe(320_000);
    expect(mismatches.slice(0, 5)).toEqual([]);
  });

  it("handles the special values as Math.hypot does", () => {
    const special = [0, -0, NaN, Infinity, -Infinity, Number.MIN_VALUE, Number.MAX_VALUE, -1, 3];
    for (const x of special) for (const y of special) expect(Object.is(hypot(x, y), Math.hypot(x, y)), `${x}, ${y}`).toBe(true);
    expect(hypot(NaN, -Infinity)).toBe(Infinity);
    expect(hypot(3, 4)).toBe(5);
    expect(hypot(-5, 12)).toBe(13);
    expect(hypot(1e300, 1e300)).toBeCloseTo(Math.SQRT2 * 1e300, -290);
  });
});
