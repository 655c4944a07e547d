// OpenCV's matcher as wired here (window copy, template upload, turned templates) against the
// formulas themselves. Sources: the TM_CCOEFF_NORMED formula of OpenCV's matchTemplate
// documentation, computed directly; the exact pixel mapping of a quarter turn.
import seedrandom from "seedrandom";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createCvMatcher, type Matcher } from "../../../shared/tracking/matcher";
import { loadOpenCv } from "../../../shared/tracking/opencv";
import type { GrayFrame } from "../../../shared/tracking/types";
import { directNcc } from "./support/direct-ncc";

const rng = seedrandom("matcher");
const randomFrame = (width: number, height: number): GrayFrame => ({ width, height, data: Uint8Array.from({ length: width * height }, () => Math.floor(rng() * 256)) });

let matcher: Matcher;
beforeAll(async () => {
  matcher = createCvMatcher((await loadOpenCv()).cv);
});
afterAll(() => matcher.dispose());

describe("match", () => {
  it("gives the TM_CCOEFF_NORMED score of every placement inside an off-origin window", () => {
    const frame = randomFrame(64, 48);
    const template = randomFrame(9, 7);
    const window = { x: 13, y: 7, width: 30, height: 20 };
    const map = matcher.match(frame, window, template);
    expect([map.width, map.height]).toEqual([22, 14]);
    const direct = directNcc(frame, window, template);
    let worst = 0;
    for (let i = 0; i < map.data.length; i++) worst = Math.max(worst, Math.abs(map.data[i] - direct.data[i]));
    expect(worst).toBeLessThan(1e-4);
  });

  it("scores 1 where the template was cut from, after a different template was used", () => {
    const frame = randomFrame(64, 48);
    const cut = (x: number, y: number): GrayFrame => ({
      width: 8,
      height: 8,
      data: Uint8Array.from({ length: 64 }, (_, i) => frame.data[(y + Math.floor(i / 8)) * 64 + x + (i % 8)]),
    });
    matcher.match(frame, { x: 0, y: 0, width: 20, height: 20 }, cut(1, 1));
    const map = matcher.match(frame, { x: 20, y: 10, width: 30, height: 30 }, cut(31, 22));
    expect(map.data[12 * map.width + 11]).toBeCloseTo(1, 5);
  });
});

describe("turn", () => {
  const source = randomFrame(20, 20);
  const at = (x: number, y: number) => source.data[y * 20 + x];

  it("at angle 0 around a pixel corner gives the source pixels themselves", () => {
    const t = matcher.turn(source, 10, 10, 0, 8);
    for (let j = 0; j < 8; j++) for (let i = 0; i < 8; i++) expect(t.data[j * 8 + i]).toBe(at(6 + i, 6 + j));
  });

  it("a quarter turn clockwise (on screen) shows what lay to the right of the centre below it", () => {
    // Output pixel (i, j) shows the source at (6 + j, 13 − i): pixel centres land on pixel centres.
    const t = matcher.turn(source, 10, 10, Math.PI / 2, 8);
    for (let j = 0; j < 8; j++) for (let i = 0; i < 8; i++) expect(t.data[j * 8 + i]).toBe(at(6 + j, 13 - i));
  });
});
