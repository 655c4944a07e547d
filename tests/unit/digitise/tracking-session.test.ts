// The tracking assist's review flow: proposals stay apart from marks until accepted.
import { describe, expect, it } from "vitest";
import { TrackingSession } from "@/features/digitise/model/tracking-session";
import type { Landmark, Mark } from "@shared/schemas/shots";

function setup() {
  const accepted: [Landmark, Mark[]][] = [];
  const runs: [Landmark, Mark][] = [];
  let cancels = 0;
  const s = new TrackingSession({ accept: (l, m) => accepted.push([l, m]), run: (l, m) => runs.push([l, m]), cancelRun: () => cancels++ });
  return { s, accepted, runs, cancels: () => cancels };
}
const propose = (s: TrackingSession, from: number, n: number) => {
  for (let i = 1; i <= n; i++) s.proposal({ frame: from + i, x: 100 + i, y: 50, confidence: 0.9 });
};

describe("tracking session", () => {
  it("runs, collects proposals with progress, and stops into review", () => {
    const { s, runs } = setup();
    s.start("puck", [10, 100, 50], 20);
    expect(runs).toEqual([["puck", [10, 100, 50]]]);
    propose(s, 10, 5);
    s.progress(5, 20);
    expect(s.state).toMatchObject({ mode: "running", done: 5, total: 20 });
    s.finished("Stopped at frame 16: the match dropped below 0.6.");
    expect(s.state).toMatchObject({ mode: "review", landmark: "puck" });
    expect(s.proposalAt(13)).toMatchObject({ x: 103 });
  });

  it("accept all stores every proposal as one edit; accept up to keeps the earlier ones only", () => {
    const a = setup();
    a.s.start("bladeToe", [1, 0, 0], 9);
    propose(a.s, 1, 6);
    a.s.finished("done");
    a.s.acceptAll();
    expect(a.accepted).toHaveLength(1);
    expect(a.accepted[0][1].map((m) => m[0])).toEqual([2, 3, 4, 5, 6, 7]);
    expect(a.s.state.mode).toBe("idle");

    const b = setup();
    b.s.start("bladeToe", [1, 0, 0], 9);
    propose(b.s, 1, 6);
    b.s.finished("done");
    b.s.acceptUpTo(4);
    expect(b.accepted[0][1].map((m) => m[0])).toEqual([2, 3, 4]);
  });

  it("a correction accepts the proposals before it with the corrected mark, and runs again from it", () => {
    const { s, accepted, runs } = setup();
    s.start("puck", [10, 100, 50], 20);
    propose(s, 10, 8);
    s.finished("done");
    expect(s.correct("puck", 14, [120.5, 49.25])).toBe(true);
    expect(accepted[0]).toEqual(["puck", [[11, 101, 50], [12, 102, 50], [13, 103, 50], [14, 120.5, 49.25]]]);
    expect(runs.at(-1)).toEqual(["puck", [14, 120.5, 49.25]]);
    expect(s.state).toMatchObject({ mode: "running", from: 14, proposals: [] });
  });

  it("a click on another landmark or an unproposed frame is an ordinary mark", () => {
    const { s } = setup();
    s.start("puck", [10, 100, 50], 20);
    propose(s, 10, 3);
    expect(s.correct("topHand", 12, [1, 1])).toBe(false);
    expect(s.correct("puck", 30, [1, 1])).toBe(false);
  });

  it("cancel keeps what was proposed so far for review; discard drops it", () => {
    const { s, accepted, cancels } = setup();
    s.start("puck", [10, 100, 50], 20);
    propose(s, 10, 2);
    s.cancel();
    expect(cancels()).toBe(1);
    expect(s.state).toMatchObject({ mode: "review", message: /cancelled/ });
    s.discard();
    expect(s.state.mode).toBe("idle");
    expect(accepted).toEqual([]);
  });
});
