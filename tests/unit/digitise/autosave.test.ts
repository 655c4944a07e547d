// Autosave as a state machine with a fake server, fake timers and an in-memory local storage.
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { Autosave, contentKey, localKey, readLocal, recover, SaveError, type MarksContent, type MergeNotice } from "@/features/digitise/model/autosave";
import type { SaveMarksBody } from "@shared/schemas/shots";

class MemoryStorage {
  m = new Map<string, string>();
  getItem = (k: string) => this.m.get(k) ?? null;
  setItem = (k: string, v: string) => void this.m.set(k, v);
  removeItem = (k: string) => void this.m.delete(k);
}

/** A server with one shot and the same version rule as server/shots/service.ts. */
class FakeServer {
  version = 1;
  content: MarksContent = { marks: {}, events: {} };
  down = false;
  loseAnswers = false;
  calls: SaveMarksBody[] = [];
  async send(b: SaveMarksBody) {
    this.calls.push(b);
    if (this.down) throw new SaveError({ kind: "network" });
    const same = contentKey(b) === contentKey(this.content);
    if (!same) {
      if (b.baseVersion !== this.version) throw new SaveError({ kind: "conflict", conflict: { currentVersion: this.version, savedBy: "Morgan Ashby", savedAt: "2026-03-01T10:00:00Z" } });
      this.version++;
      this.content = { marks: b.marks, events: b.events };
    }
    if (this.loseAnswers) throw new SaveError({ kind: "network" });
    return { version: this.version, updatedAt: "", updatedByName: "Priya", storedResult: null };
  }
  async current() {
    return { ...this.content, version: this.version };
  }
}

const heel: [number, number, number][] = [[1, 100, 200], [2, 101, 201]];
const puck = (n: number): MarksContent => ({ marks: { puck: Array.from({ length: n }, (_, i) => [i + 1, 10 + i, 20] as [number, number, number]) }, events: {} });

let server: FakeServer, storage: MemoryStorage, statuses: string[];
const make = () =>
  new Autosave(
    { shotId: "s1", send: (b) => server.send(b), fetchCurrent: () => server.current(), storage, debounceMs: 500, onStatus: (s) => statuses.push(s.kind) },
    { ...server.content, version: server.version },
  );

/** Let chained promises and zero-delay timers run. */
const settle = async () => {
  for (let i = 0; i < 5; i++) await vi.advanceTimersByTimeAsync(1);
};

beforeEach(() => {
  vi.useFakeTimers();
  server = new FakeServer();
  storage = new MemoryStorage();
  statuses = [];
});
afterEach(() => vi.useRealTimers());

describe("autosave", () => {
  it("debounces a burst of edits into one save, and clears the local copy once saved", async () => {
    const a = make();
    for (let i = 1; i <= 5; i++) a.edit(puck(i));
    expect(readLocal(storage, "s1")?.content).toEqual(puck(5));
    expect(server.calls).toHaveLength(0);
    await vi.advanceTimersByTimeAsync(500);
    expect(server.calls).toHaveLength(1);
    expect(server.calls[0]).toMatchObject({ baseVersion: 1 });
    expect(server.content).toEqual(puck(5));
    expect(a.status).toEqual({ kind: "saved", version: 2 });
    expect(storage.getItem(localKey("s1"))).toBeNull();
    expect(statuses).toEqual(["pending", "pending", "pending", "pending", "pending", "saving", "saved"]);
  });

  it("offline: keeps the edits locally, retries with back-off, and sends the latest when the server is back", async () => {
    server.down = true;
    const a = make();
    a.edit(puck(1));
    await vi.advanceTimersByTimeAsync(500);
    expect(a.status).toMatchObject({ kind: "offline", attempt: 1, retryInMs: 1000 });
    a.edit(puck(2));
    await vi.advanceTimersByTimeAsync(1000);
    expect(a.status).toMatchObject({ kind: "offline", attempt: 2, retryInMs: 2000 });
    expect(readLocal(storage, "s1")?.content).toEqual(puck(2));
    server.down = false;
    a.online();
    await vi.advanceTimersByTimeAsync(0);
    expect(server.content).toEqual(puck(2));
    expect(a.status).toEqual({ kind: "saved", version: 2 });
    expect(storage.m.size).toBe(0);
  });

  it("a save whose answer was lost is recognised as ours, not reported as a conflict", async () => {
    const a = make();
    server.loseAnswers = true;
    a.edit(puck(1));
    await vi.advanceTimersByTimeAsync(500); // the server stored version 2, the answer never came
    expect(server.version).toBe(2);
    server.loseAnswers = false;
    a.edit(puck(2)); // still based on version 1 as far as the page knows
    await vi.advanceTimersByTimeAsync(1000);
    await settle();
    expect(server.content).toEqual(puck(2));
    expect(server.version).toBe(3);
    expect(a.status).toEqual({ kind: "saved", version: 3 });
  });

  it("someone else's save is a conflict: nothing overwritten until the analyst chooses", async () => {
    const a = make();
    server.version = 5;
    server.content = puck(9);
    a.edit(puck(1));
    await vi.advanceTimersByTimeAsync(500);
    expect(a.status).toEqual({ kind: "conflict", conflict: { currentVersion: 5, savedBy: "Morgan Ashby", savedAt: "2026-03-01T10:00:00Z" }, overlaps: ["puck"] });
    expect(server.content).toEqual(puck(9));
    a.edit(puck(2));
    await vi.advanceTimersByTimeAsync(5000);
    expect(server.calls).toHaveLength(1);
    expect(readLocal(storage, "s1")?.content).toEqual(puck(2));
    await a.keepMine();
    await vi.advanceTimersByTimeAsync(0);
    expect(server.content).toEqual(puck(2));
    expect(a.status).toEqual({ kind: "saved", version: 6 });
  });

  it("taking theirs drops the local copy", async () => {
    const a = make();
    server.version = 3;
    server.content = puck(4);
    a.edit(puck(1));
    await vi.advanceTimersByTimeAsync(500);
    await a.takeTheirs();
    expect(a.status).toEqual({ kind: "saved", version: 3 });
    expect(storage.m.size).toBe(0);
  });

  it("someone else's save on other landmarks is merged, not a conflict: both edits are kept", async () => {
    const notices: MergeNotice[] = [];
    const a = new Autosave(
      { shotId: "s1", send: (b) => server.send(b), fetchCurrent: () => server.current(), storage, debounceMs: 500, onMerged: (n) => notices.push(n) },
      { ...server.content, version: server.version },
    );
    // Morgan marks the blade heel and the puck strike meanwhile (version 2); we mark the puck.
    server.version = 2;
    server.content = { marks: { bladeHeel: heel }, events: { puckStrike: 3 } };
    a.edit(puck(2));
    await vi.advanceTimersByTimeAsync(500);
    await settle();
    expect(server.content).toEqual({ marks: { puck: puck(2).marks.puck, bladeHeel: heel }, events: { puckStrike: 3 } });
    expect(a.status).toEqual({ kind: "saved", version: 3 });
    expect(notices.map((n) => [n.savedBy, n.theirs])).toEqual([["Morgan Ashby", ["bladeHeel", "puckStrike"]]]);
  });

  it("keeping mine where both changed the puck still keeps their blade heel, and says what it replaced", async () => {
    const notices: MergeNotice[] = [];
    const a = new Autosave(
      { shotId: "s1", send: (b) => server.send(b), fetchCurrent: () => server.current(), storage, debounceMs: 500, onMerged: (n) => notices.push(n) },
      { ...server.content, version: server.version },
    );
    server.version = 2;
    server.content = { marks: { puck: puck(5).marks.puck, bladeHeel: heel }, events: {} };
    a.edit(puck(1));
    await vi.advanceTimersByTimeAsync(500);
    await settle();
    expect(a.status.kind === "conflict" && a.status.overlaps).toEqual(["puck"]);
    await a.keepMine();
    await settle();
    expect(server.content).toEqual({ marks: { puck: puck(1).marks.puck, bladeHeel: heel }, events: {} });
    expect(notices.at(-1)).toMatchObject({ theirs: ["bladeHeel"], replaced: ["puck"] });
  });

  it("taking theirs where both changed the puck keeps our other edits", async () => {
    const a = make();
    server.version = 2;
    server.content = puck(5);
    a.edit({ marks: { puck: puck(1).marks.puck, bladeToe: heel }, events: {} });
    await vi.advanceTimersByTimeAsync(500);
    await settle();
    await a.takeTheirs();
    await settle();
    expect(server.content).toEqual({ marks: { puck: puck(5).marks.puck, bladeToe: heel }, events: {} });
  });

  it("undoing back to the saved content needs no save", async () => {
    const a = make();
    a.edit(puck(1));
    a.edit({ marks: {}, events: {} });
    await vi.advanceTimersByTimeAsync(2000);
    expect(server.calls).toHaveLength(0);
    expect(a.status).toEqual({ kind: "saved", version: 1 });
  });
});

describe("recovering local edits after a reload", () => {
  const rec = (baseVersion: number, content: MarksContent, sentKeys: string[] = []) => ({ v: 1 as const, baseVersion, content, sentKeys, savedAt: 0 });
  it("same version: put the edits back", () => {
    expect(recover(rec(4, puck(3)), { ...puck(2), version: 4 })).toEqual({ action: "restore", content: puck(3), baseVersion: 4, mergedTheirs: [] });
  });
  it("already on the server: nothing to do", () => {
    expect(recover(rec(4, puck(3)), { ...puck(3), version: 5 })).toEqual({ action: "none" });
  });
  it("the server moved on with something we sent: restore on top of it", () => {
    expect(recover(rec(4, puck(3), [contentKey(puck(2))]), { ...puck(2), version: 5 })).toEqual({ action: "restore", content: puck(3), baseVersion: 5, mergedTheirs: [] });
  });
  it("the server moved on with someone else's edits: a conflict", () => {
    expect(recover(rec(4, puck(3)), { ...puck(7), version: 6 })).toEqual({ action: "conflict", content: puck(3), base: null, overlaps: [] });
  });
  it("the server moved on elsewhere, and the record knows its base: merged per landmark", () => {
    const base = puck(2);
    const theirs = { marks: { ...puck(2).marks, bladeHeel: heel }, events: {}, version: 6 };
    expect(recover({ ...rec(4, puck(3)), base }, theirs)).toEqual({
      action: "restore", content: { marks: { puck: puck(3).marks.puck, bladeHeel: heel }, events: {} }, baseVersion: 6, mergedTheirs: ["bladeHeel"],
    });
    expect(recover({ ...rec(4, puck(3)), base }, { ...puck(7), version: 6 })).toEqual({ action: "conflict", content: puck(3), base, overlaps: ["puck"] });
  });
  it("nothing stored, or garbage stored", () => {
    expect(recover(null, { ...puck(1), version: 1 })).toEqual({ action: "none" });
    const st = new MemoryStorage();
    st.setItem(localKey("x"), "{not json");
    expect(readLocal(st, "x")).toBeNull();
  });
});
