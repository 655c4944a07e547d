// Frame prefetch policy with a fake loader: order, window, cancellation, eviction.
import { describe, expect, it } from "vitest";
import { capacityFor, FrameCache } from "@/components/shot/stepping/frame-cache";

function fakeLoader() {
  const started: number[] = [];
  const aborted: number[] = [];
  const closed: number[] = [];
  const pending = new Map<number, () => void>();
  const load = (frame: number, signal: AbortSignal) => {
    started.push(frame);
    return new Promise<{ frame: number; close(): void }>((resolve, reject) => {
      pending.set(frame, () => resolve({ frame, close: () => closed.push(frame) }));
      // Like fetch: an aborted load rejects.
      signal.addEventListener("abort", () => {
        aborted.push(frame);
        reject(new DOMException("aborted", "AbortError"));
      });
    });
  };
  const finish = async (...frames: number[]) => {
    for (const f of frames) pending.get(f)?.();
    await new Promise((r) => setTimeout(r, 0));
  };
  return { load, started, aborted, closed, pending, finish };
}

describe("frame cache", () => {
  it("loads the frame asked for first, then ahead in the direction of travel, then behind", () => {
    const l = fakeLoader();
    const c = new FrameCache({ load: l.load, first: 1, last: 1000, ahead: 4, behind: 2, concurrency: 3 });
    void c.focus(100, 1);
    expect(l.started).toEqual([100, 101, 102]);
    expect(c.window(100, -1)).toEqual([100, 99, 98, 97, 96, 101, 102]);
  });

  it("keeps within the clip's frames", () => {
    const c = new FrameCache({ load: fakeLoader().load, first: 1, last: 5, ahead: 4, behind: 2 });
    expect(c.window(4, 1)).toEqual([4, 5, 3, 2]);
  });

  it("resolves the focus with the decoded frame and tells listeners", async () => {
    const l = fakeLoader();
    const c = new FrameCache({ load: l.load, first: 1, last: 100, ahead: 2, behind: 0, concurrency: 1 });
    const loaded: number[] = [];
    c.onLoaded((f) => loaded.push(f));
    const p = c.focus(10, 1);
    await l.finish(10);
    expect((await p).frame).toBe(10);
    expect(c.has(10)).toBe(true);
    expect(l.started).toEqual([10, 11]);
    expect(loaded).toEqual([10]);
  });

  it("a jump cancels loads that fell out of the window", async () => {
    const l = fakeLoader();
    const c = new FrameCache({ load: l.load, first: 1, last: 1000, ahead: 3, behind: 0, concurrency: 4 });
    void c.focus(10, 1);
    void c.focus(500, 1);
    await new Promise((r) => setTimeout(r, 0));
    expect(l.aborted.sort()).toEqual([10, 11, 12, 13]);
    expect(l.started.slice(4)).toEqual([500, 501, 502, 503]);
  });

  it("evicts and closes the frames farthest from the focus once over capacity", async () => {
    const l = fakeLoader();
    const c = new FrameCache({ load: l.load, first: 1, last: 1000, ahead: 1, behind: 0, capacity: 3, concurrency: 8 });
    for (const f of [1, 3, 5, 7]) {
      void c.focus(f, 1);
      await l.finish(f, f + 1);
    }
    expect(c.size).toBeLessThanOrEqual(3);
    void c.focus(9, 1);
    await l.finish(9, 10);
    expect(c.has(9) && c.has(10)).toBe(true);
    expect(l.closed.slice(0, 2).sort((a, b) => a - b)).toEqual([1, 2]);
    expect(c.size).toBe(3);
  });

  it("sizes its budget by the frame size", () => {
    expect(capacityFor(1280, 720)).toBe(54); // 192 MiB / (1280 × 720 × 4 B)
    expect(capacityFor(3840, 2160)).toBe(12);
    expect(capacityFor(320, 240)).toBe(96);
  });
});
