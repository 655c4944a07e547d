// Accepting a tracking run's proposals: an analyst's mark or event is never replaced, the scope
// (a landmark, up to a frame) is kept, one undo takes it all back; seeds are placed one click per
// landmark. [calc]: small hand-made documents.
import { describe, expect, it } from "vitest";
import type { TrackingProposals } from "@shared/schemas/tracking";
import { acceptance, pendingAt, pendingCount } from "@/features/digitise/model/proposals";
import { DigitiseStore, type DigitiseDoc } from "@/features/digitise/model/store";
import { toScreen } from "@/features/digitise/model/viewport";

const end = { reason: "end-of-range" as const, frame: null, message: "" };
const proposals: TrackingProposals = {
  seedFrame: 10,
  tracks: {
    puck: { marks: [[11, 100, 200, 0.98], [12, 104, 200, 0.97], [13, 108, 199, 0.95]], forward: end, backward: end },
    bladeHeel: { marks: [[11, 50, 210, 0.99], [12, 52, 210, 0.99]], forward: { reason: "left-frame", frame: 13, message: "…" }, backward: end },
  },
  events: { puckStrike: { frame: 11, confidence: 0.9, evidence: "…" }, release: { frame: 13, confidence: 0.8, evidence: "…" } },
  scaleBar: { a: [90, 200], b: [124, 200], lengthMm: 76.2, widthPx: 34, frame: 10 },
  scaleBarNote: null,
};

describe("acceptance", () => {
  const doc = { marks: { puck: [[12, 103, 201] as [number, number, number]] }, events: { release: 14 } };

  it("fills only frames and events the analyst left empty", () => {
    const a = acceptance(proposals, doc);
    expect(a.marks.puck).toEqual([[11, 100, 200], [13, 108, 199]]);
    expect(a.marks.bladeHeel).toEqual([[11, 50, 210], [12, 52, 210]]);
    expect(a.keptAnalyst).toBe(1);
    expect(a.added).toBe(4);
    expect(a.events).toEqual({ puckStrike: 11 });
  });

  it("keeps to one landmark, or to frames up to one", () => {
    expect(Object.keys(acceptance(proposals, doc, { landmarks: ["bladeHeel"], events: false }).marks)).toEqual(["bladeHeel"]);
    const upTo = acceptance(proposals, { marks: {}, events: {} }, { upTo: 11 });
    expect(upTo.marks).toEqual({ puck: [[11, 100, 200]], bladeHeel: [[11, 50, 210]] });
    expect(upTo.events).toEqual({ puckStrike: 11 });
  });

  it("shows only what is still to accept", () => {
    expect(pendingAt(proposals, doc.marks, 12).map((p) => p.landmark)).toEqual(["bladeHeel"]);
    expect(pendingCount(proposals, doc.marks, "puck")).toBe(2);
  });
});

const emptyDoc = (): DigitiseDoc => ({ marks: {}, events: {}, calibration: null });
function makeStore() {
  const s = new DigitiseStore({ readOnly: false, frameSize: { width: 1280, height: 720 }, frameStart: 1, frameEnd: 300, captureFps: 3200, doc: emptyDoc(), frame: 10 });
  s.setStage(1000, 600);
  return s;
}
const click = (s: DigitiseStore, x: number, y: number) => {
  const p = toScreen(s.getState().view, [x, y]);
  s.pointer({ type: "down", screen: p, button: 0 });
  s.pointer({ type: "up", screen: p, button: 0 });
};

describe("the store", () => {
  it("seeding: each click places the next landmark on this frame; skip leaves one out; it ends after the last", () => {
    const s = makeStore();
    s.startSeeding();
    expect(s.getState().activeLandmark).toBe("puck");
    click(s, 100, 200);
    expect(s.getState().activeLandmark).toBe("bladeHeel");
    click(s, 50, 210);
    click(s, 80, 210);
    click(s, 60, 100);
    click(s, 40, 20);
    expect(s.getState().activeLandmark).toBe("buttEnd");
    s.skipSeed();
    expect(s.getState().seeding).toBe(false);
    const m = s.getState().doc.marks;
    expect(Object.keys(m).sort()).toEqual(["bladeHeel", "bladeToe", "bottomHand", "puck", "topHand"]);
    expect(s.getState().frame).toBe(10);
  });

  it("accepting is one undoable edit that never moves an analyst's mark, and sets the scale bar when given", () => {
    const s = makeStore();
    click(s, 103, 201); // the analyst's puck on frame 10
    s.goto(12);
    click(s, 103.5, 201.5); // and on frame 12
    const doc = s.getState().doc;
    const mine = doc.marks.puck!.find((q) => q[0] === 12);
    const a = acceptance(proposals, doc);
    s.acceptProposals(a.marks, a.events, { type: "scaleBar", a: [90, 200], b: [124, 200], length: 76.2, unit: "mm" });
    const after = s.getState().doc;
    expect(after.marks.puck!.find((q) => q[0] === 12)).toBe(mine);
    expect(after.marks.puck!.map((q) => q[0])).toEqual([10, 11, 12, 13]);
    expect(after.events).toEqual({ puckStrike: 11, release: 13 });
    expect(after.calibration?.type).toBe("scaleBar");
    s.undo();
    expect(s.getState().doc).toBe(doc);
  });

  it("refuses proposed events whose order is impossible with the analyst's, keeping the marks", () => {
    const s = makeStore();
    s.toggleEvent("release", 5);
    s.acceptProposals({ puck: [[11, 1, 1]] }, { puckStrike: 11 });
    expect(s.getState().doc.events).toEqual({ release: 5 });
    expect(s.getState().doc.marks.puck).toHaveLength(1);
    expect(s.getState().notice?.text).toMatch(/Proposed events not set/);
  });
});
