import { getEventListeners } from "node:events";
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { FrameStore } from "../../../server/tracking/frame-store";

// The frames between the decoder and the tracker of an auto-digitise run (decision 151).

const W = 4;
const H = 3;
const frame = (n: number) => new Uint8Array(W * H).fill(n);
let dir = "";
afterEach(() => dir && rmSync(dir, { recursive: true, force: true }));
const store = (budgetFrames: number, more: { seedFrame?: number; aheadFrames?: number; last?: number } = {}) => {
  dir = mkdtempSync(path.join(os.tmpdir(), "lf-frames-"));
  return new FrameStore({ first: 1, last: 6, width: W, height: H, budgetBytes: budgetFrames * W * H, spillDir: dir, ...more });
};
const settled = async (p: Promise<unknown>) => {
  let done = false;
  void p.then(() => (done = true));
  for (let i = 0; i < 5; i++) await new Promise((r) => setImmediate(r));
  return done;
};

describe("FrameStore", () => {
  it("keeps frames in memory up to the budget and beyond it in the file, handing each over once", async () => {
    const s = store(2);
    for (const f of [1, 2, 3, 4]) await s.put(f, frame(f));
    expect(s.heldInMemory).toBe(2);
    expect(s.spilledCount).toBe(2);
    for (const f of [4, 1, 3, 2]) expect([...(await s.frame(f)).data]).toEqual([...frame(f)]);
    await expect(s.frame(3)).rejects.toThrow(/already handed over/);
    await s.close();
  });

  it("a frame not yet decoded is waited for; a decoder that ends early fails the wait with its reason", async () => {
    const s = store(8);
    const waiting = s.frame(5);
    await s.put(5, frame(5));
    expect((await waiting).data[0]).toBe(5);
    const never = s.frame(6);
    s.end(new Error("the clip gave 5 of the shot's 6 frames"));
    await expect(never).rejects.toThrow("the clip gave 5 of the shot's 6 frames");
  });

  it("leaves no listener on the run's signal once a waited frame arrives (six landmarks × hundreds of frames)", async () => {
    const s = store(8);
    const abort = new AbortController();
    for (const f of [1, 2, 3]) {
      const waiting = s.frame(f, abort.signal);
      await s.put(f, frame(f));
      await waiting;
    }
    expect(getEventListeners(abort.signal, "abort")).toHaveLength(0);
    const cancelled = s.frame(4, abort.signal);
    abort.abort(new Error("cancelled by the analyst"));
    await expect(cancelled).rejects.toThrow("cancelled by the analyst");
  });

  it("past the seed frame holds the decoder a few frames ahead of the tracker; frames before it are all kept", async () => {
    const s = store(1, { seedFrame: 3, aheadFrames: 2, last: 10 });
    for (const f of [1, 2, 3, 4, 5]) await s.put(f, frame(f));
    expect(s.spilledCount).toBe(2); // before the seed beyond the one-frame budget: to the file, as before
    const sixth = s.put(6, frame(6));
    expect(await settled(sixth)).toBe(false);
    for (const f of [3, 2, 1]) await s.frame(f); // the backward pass: the decoder still waits
    expect(await settled(sixth)).toBe(false);
    expect((await s.frame(4)).data[0]).toBe(4); // the forward pass takes one: room for the next
    expect(await settled(sixth)).toBe(true);
    expect(await settled(s.put(7, frame(7)))).toBe(false);
    await s.close(); // the run is over: a decoder held back is let go, its frame dropped
    await s.put(7, frame(7));
    expect(s.heldInMemory).toBe(2);
  });

  it("by default runs ahead by a quarter of the memory budget, 8 to 120 frames", () => {
    const at = (width: number, height: number, mb: number) => new FrameStore({ first: 1, last: 9, width, height, budgetBytes: mb * 1024 * 1024, spillDir: os.tmpdir(), seedFrame: 1 }).aheadLimit;
    expect(at(1280, 720, 768)).toBe(120);
    expect(at(1920, 1080, 768)).toBe(97);
    expect(at(3840, 2160, 768)).toBe(24);
    expect(at(3840, 2160, 16)).toBe(8);
  });

  it("a frame given back is decoded into again; one not handed over, or given back twice, is not taken", async () => {
    const s = store(8);
    const first = s.buffer();
    first.fill(1);
    await s.put(1, first);
    const got = await s.frame(1);
    expect(got.data).toBe(first);
    s.release(got);
    s.release(got);
    s.release({ width: W, height: H, data: new Uint8Array(W * H) });
    expect(s.pooled).toBe(1);
    expect(s.buffer()).toBe(first);
    expect(s.buffer()).not.toBe(first);
    await s.close();
  });
});
