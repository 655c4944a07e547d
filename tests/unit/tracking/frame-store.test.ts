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
const store = (budgetFrames: number) => {
  dir = mkdtempSync(path.join(os.tmpdir(), "lf-frames-"));
  return new FrameStore({ first: 1, last: 6, width: W, height: H, budgetBytes: budgetFrames * W * H, spillDir: dir });
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
});
