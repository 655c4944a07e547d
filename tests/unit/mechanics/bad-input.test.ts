// The bad inputs listed in issue 5: each gets a MechanicsInputError naming the field, and no
// result. [CP] what an analyst can get wrong when digitising; no outside source needed.
import { describe, expect, it } from "vitest";
import { computeShot, makeCalibration, MechanicsInputError, syntheticShot, validateCalibration } from "../../../shared/mechanics/index";

const { doc } = syntheticShot({ frames: 300, noisePx: 0.5 });
const puck = doc.tracks.puck;
const release = doc.events.release;

function fails(input: unknown, path: string, message: RegExp) {
  let err: unknown;
  try {
    computeShot(input, { trials: 20 });
  } catch (e) {
    err = e;
  }
  expect(err).toBeInstanceOf(MechanicsInputError);
  const e = err as MechanicsInputError;
  expect(e.path).toBe(path);
  expect(e.message).toMatch(message);
  expect(e.message.startsWith(`${path}: `) || path === "").toBe(true);
  expect(e.message).not.toContain("\n");
}

describe("bad shot documents", () => {
  it("the good document computes", () => {
    expect(computeShot(doc, { trials: 20 }).puckExitSpeed.valueMps).toBeGreaterThan(0);
  });
  it("capture fps missing, zero or negative", () => {
    fails({ ...doc, captureFps: undefined }, "captureFps", /required.*capture rate/);
    fails({ ...doc, captureFps: 0 }, "captureFps", /above 0/);
    fails({ ...doc, captureFps: -240 }, "captureFps", /above 0/);
  });
  it("scale bar with identical ends, or a length of 0 or less", () => {
    fails({ ...doc, calibration: { type: "scaleBar", a: [5, 5], b: [5, 5], lengthMm: 76.2 } }, "calibration.b", /identical/);
    fails({ ...doc, calibration: { type: "scaleBar", a: [5, 5], b: [45, 5], lengthMm: 0 } }, "calibration.lengthMm", /above 0/);
    fails({ ...doc, calibration: { type: "scaleBar", a: [5, 5], b: [45, 5], lengthMm: -76.2 } }, "calibration.lengthMm", /above 0/);
  });
  it("plane with fewer than 4 points, or collinear points", () => {
    const p = (x: number, y: number, X: number, Y: number) => ({ image: [x, y], world: [X, Y] });
    fails({ ...doc, calibration: { type: "plane", points: [p(0, 0, 0, 0), p(100, 0, 1000, 0), p(0, 100, 0, 1000)] } }, "calibration.points", /at least 4 points/);
    fails({ ...doc, calibration: { type: "plane", points: [p(0, 0, 0, 0), p(100, 0, 1000, 0), p(200, 0, 2000, 0), p(0, 100, 0, 1000)] } }, "calibration.points", /one line/);
  });
  it("events out of order", () => {
    fails({ ...doc, events: { ...doc.events, release: doc.events.puckStrike } }, "events.release", /after puck strike/);
    fails({ ...doc, events: { ...doc.events, iceStrike: doc.events.puckStrike + 1 } }, "events.iceStrike", /not come after puck strike/);
    fails({ ...doc, events: { ...doc.events, peakBend: release + 5 } }, "events.peakBend", /between/);
  });
  it("fewer than 3 puck marks after release", () => {
    const few = puck.filter((m) => m[0] < release || m[0] === release + 4 || m[0] === release + 9);
    fails({ ...doc, tracks: { ...doc.tracks, puck: few } }, "tracks.puck", /at least 3 puck marks.*found 2/);
  });
  it("NaN or infinite coordinates", () => {
    fails({ ...doc, tracks: { ...doc.tracks, puck: [[0, Number.NaN, 3], ...puck.slice(1)] } }, "tracks.puck[0][1]", /finite/);
    fails({ ...doc, tracks: { ...doc.tracks, topHand: [[4, 10, Number.POSITIVE_INFINITY]] } }, "tracks.topHand[0][2]", /finite/);
    fails({ ...doc, calibration: { type: "scaleBar", a: [Number.NaN, 1], b: [40, 1] } }, "calibration.a[0]", /finite/);
  });
  it("frames outside the clip", () => {
    fails({ ...doc, frameCount: 250 }, "tracks.puck[250]", /outside the clip \(frames 0–249\)/);
    fails({ ...doc, frameCount: undefined, frameRange: [10, 400] }, "tracks.puck[0]", /outside the clip \(frames 10–400\)/);
    fails({ ...doc, frameCount: undefined, frameRange: [0, 200] }, "events.release", /outside the clip/);
  });
  it("a frame marked twice, a misspelt track, a cutoff above the Nyquist rate", () => {
    fails({ ...doc, tracks: { ...doc.tracks, bottomHand: [[7, 1, 1], [7, 2, 2]] } }, "tracks.bottomHand[1]", /marked twice/);
    fails({ ...doc, tracks: { ...doc.tracks, bladeheel: [] } }, "tracks", /unknown field "bladeheel"/);
    fails({ ...doc, cutoffHz: 1700 }, "cutoffHz", /too high/);
  });
  it("malformed marks: each named at the mark, before any later problem", () => {
    const top = doc.tracks.topHand!;
    fails({ ...doc, tracks: { ...doc.tracks, bladeToe: "toe" } }, "tracks.bladeToe", /list of \[frame, x, y\] marks/);
    fails({ ...doc, tracks: { ...doc.tracks, puck: [...puck.slice(0, 5), [5, 1], ...puck.slice(6)] } }, "tracks.puck[5]", /a mark must be \[frame, x, y\]/);
    fails({ ...doc, tracks: { ...doc.tracks, puck: [...puck.slice(0, 3), [-1, 1, 1], ...puck.slice(4)] } }, "tracks.puck[3][0]", /whole number, 0 or more \(got -1\)/);
    fails({ ...doc, tracks: { ...doc.tracks, puck: [...puck.slice(0, 3), [3.5, 1, 1], ...puck.slice(4)] } }, "tracks.puck[3][0]", /whole number/);
    fails({ ...doc, tracks: { ...doc.tracks, puck: [...puck.slice(0, 3), [3, 1, "2"], ...puck.slice(4)] } }, "tracks.puck[3][2]", /finite numbers \(got \[1, 2\]\)/);
    // The malformed mark comes first: before a frame marked twice in an earlier track, a wrong
    // event order, a bad calibration, and a bad field after the tracks.
    const badTop = { ...doc.tracks, puck: [puck[0], ...puck], topHand: [...top.slice(0, 9), [top[9][0], Number.NaN, 1], ...top.slice(10)] };
    fails({ ...doc, tracks: badTop }, "tracks.topHand[9][1]", /finite/);
    fails({ ...doc, tracks: badTop, events: { ...doc.events, release: doc.events.puckStrike } }, "tracks.topHand[9][1]", /finite/);
    fails({ ...doc, tracks: badTop, calibration: { type: "scaleBar", a: [5, 5], b: [5, 5] } }, "tracks.topHand[9][1]", /finite/);
    fails({ ...doc, tracks: badTop, stick: { flex: -85 } }, "tracks.topHand[9][1]", /finite/);
    fails({ ...doc, tracks: { ...doc.tracks, puck: [puck[0], ...puck] }, stick: { flex: -85 } }, "stick.flex", /above 0/);
    fails({ ...doc, tracks: { ...doc.tracks, puck: [puck[0], ...puck] } }, "tracks.puck[1]", /marked twice/);
  });
  it("marks out of frame order are sorted and give the same results", () => {
    const shuffled = { ...doc, tracks: { ...doc.tracks, puck: [...puck].reverse(), topHand: [...doc.tracks.topHand!.slice(1), doc.tracks.topHand![0]] } };
    expect(computeShot(shuffled, { trials: 20 })).toEqual(computeShot(doc, { trials: 20 }));
  });
  it("not a document at all", () => {
    fails(null, "", /shot document/);
    fails("shot.json", "", /shot document/);
  });
});

describe("calibration checks for live preview", () => {
  it("validateCalibration returns a message or null; makeCalibration throws", () => {
    expect(validateCalibration({ type: "scaleBar", a: [0, 0], b: [40, 0] })).toBeNull();
    expect(validateCalibration({ type: "scaleBar", a: [0, 0], b: [0.2, 0] })).toMatch(/identical/);
    expect(validateCalibration({ type: "scaleBar", a: [0, 0] })).toMatch(/^b: is required/);
    expect(() => makeCalibration({ type: "scaleBar", a: [0, 0], b: [0, 0] })).toThrow(MechanicsInputError);
    // Default length: a puck's 76.2 mm across (IIHF Rule 13.1 [P]).
    expect(makeCalibration({ type: "scaleBar", a: [0, 0], b: [40, 0] }).mmPerPx).toBeCloseTo(1.905, 12);
    const { toWorld } = makeCalibration({ type: "scaleBar", a: [10, 20], b: [50, 20] });
    const [X, Y] = toWorld([30, 10]); // x right, y up, from end a
    expect(X).toBeCloseTo(38.1, 12);
    expect(Y).toBeCloseTo(19.05, 12);
  });
});
