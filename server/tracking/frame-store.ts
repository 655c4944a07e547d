// The shot's grey frames between the decoder and the tracker. The tracker takes each frame once,
// back from the seed frame, then on from it, and gives it back when done with it. Frames before
// the seed wait in memory up to a budget and beyond it in a file in the job's folder, so a long 4K
// shot does not exhaust memory; past the seed the decoder is held some frames ahead of the
// tracker. Frame buffers given back are decoded into again, so only that many are ever alive:
// a shot's worth of 1 MB buffers alive at once cost the worker about as much CPU as the tracking.
import { open, type FileHandle } from "node:fs/promises";
import path from "node:path";
import type { FrameSource, GrayFrame } from "../../shared/tracking/types";

/**
 * Frames past the seed decoded ahead of the tracker by default: a quarter of the memory budget, at
 * most 120 (8 at least). The decoder runs niced; held close (24 frames) on a busy machine the
 * tracker kept waiting for it, and its CPU per frame rose (bench:track, decision 155).
 */
const AHEAD_MAX = 120;
const AHEAD_MIN = 8;

export class FrameStore implements FrameSource {
  readonly length: number;
  private readonly bytes: number;
  private readonly memory = new Map<number, Uint8Array>();
  private readonly spilled = new Set<number>();
  private readonly waiters = new Map<number, { resolve: () => void; reject: (e: unknown) => void }[]>();
  private inMemory = 0;
  private file: FileHandle | null = null;
  private ended: { error?: unknown } | null = null;
  private closed = false;
  private taken = new Set<number>();
  private readonly pool: Uint8Array[] = [];
  /** Frames past the seed held in memory, and the decoder's wait for room among them. */
  private aheadHeld = 0;
  private room: (() => void)[] = [];
  /** Buffers handed to the tracker and not yet given back. */
  private readonly out = new Set<Uint8Array>();

  constructor(
    private readonly o: {
      first: number;
      last: number;
      width: number;
      height: number;
      budgetBytes: number;
      spillDir: string;
      /** The tracker's seed frame: frames after it are taken in order, so the decoder is held back there. */
      seedFrame?: number;
      aheadFrames?: number;
    },
  ) {
    this.length = o.last + 1;
    this.bytes = o.width * o.height;
  }

  /** Frames past the seed the decoder may run ahead of the tracker. */
  get aheadLimit() {
    return this.o.aheadFrames ?? Math.max(AHEAD_MIN, Math.min(AHEAD_MAX, Math.floor(this.o.budgetBytes / 4 / this.bytes)));
  }

  /** A buffer for the decoder's next frame: one given back, or a new one. */
  buffer(): Uint8Array {
    return this.pool.pop() ?? new Uint8Array(this.bytes);
  }

  /** The tracker is done with this frame: its buffer is decoded into again. */
  release(frame: GrayFrame) {
    if (this.out.delete(frame.data)) this.pool.push(frame.data);
  }

  private letDecoderOn() {
    for (const r of this.room.splice(0)) r();
  }

  private isAhead(index: number) {
    return this.o.seedFrame !== undefined && index > this.o.seedFrame;
  }

  /**
   * A decoded frame; spilled to the file once the memory budget is used. Past the seed frame the
   * returned promise waits while the tracker is `aheadFrames` behind (it holds the decoder back).
   */
  async put(index: number, data: Uint8Array) {
    if (this.closed) return;
    if (this.isAhead(index)) {
      while (this.aheadHeld >= this.aheadLimit && !this.closed) await new Promise<void>((r) => this.room.push(r));
      if (this.closed) return;
      this.aheadHeld++;
    }
    if (this.inMemory + this.bytes <= this.o.budgetBytes || this.isAhead(index)) {
      this.memory.set(index, data);
      this.inMemory += this.bytes;
    } else {
      this.file ??= await open(path.join(this.o.spillDir, "frames.gray"), "w+");
      if (this.closed) return void (await this.close()); // closed while the file opened
      await this.file.write(data, 0, this.bytes, (index - this.o.first) * this.bytes);
      this.spilled.add(index);
      this.pool.push(data);
    }
    for (const w of this.waiters.get(index) ?? []) w.resolve();
    this.waiters.delete(index);
  }

  /** The decoder is done (or failed): frames never delivered fail with that reason. */
  end(error?: unknown) {
    this.ended = { error };
    for (const [index, ws] of this.waiters) for (const w of ws) w.reject(this.missing(index));
    this.waiters.clear();
  }

  private missing(index: number) {
    const e = this.ended?.error;
    return e instanceof Error ? e : new Error(`the decoder gave no frame ${index}`);
  }

  private has(index: number) {
    return this.memory.has(index) || this.spilled.has(index);
  }

  /** Frame `index`, once: it is released as it is handed over. */
  async frame(index: number, signal?: AbortSignal): Promise<GrayFrame> {
    if (this.taken.has(index)) throw new Error(`frame ${index} was already handed over`);
    if (!this.has(index)) {
      if (this.ended) throw this.missing(index);
      await new Promise<void>((resolve, reject) => {
        const onAbort = () => reject(signal?.reason ?? new Error("cancelled"));
        const list = this.waiters.get(index) ?? [];
        const done = (fn: () => void) => () => {
          signal?.removeEventListener("abort", onAbort);
          fn();
        };
        list.push({ resolve: done(resolve), reject: (e) => done(() => reject(e))() });
        this.waiters.set(index, list);
        signal?.addEventListener("abort", onAbort, { once: true });
      });
    }
    this.taken.add(index);
    const { width, height } = this.o;
    const inMemory = this.memory.get(index);
    if (inMemory) {
      this.memory.delete(index);
      this.inMemory -= this.bytes;
      if (this.isAhead(index)) {
        this.aheadHeld--;
        this.letDecoderOn();
      }
      this.out.add(inMemory);
      return { width, height, data: inMemory };
    }
    this.spilled.delete(index);
    const data = this.buffer();
    await this.file!.read(data, 0, this.bytes, (index - this.o.first) * this.bytes);
    this.out.add(data);
    return { width, height, data };
  }

  /** Frames held in memory right now (for tests and logs). */
  get heldInMemory() {
    return this.memory.size;
  }

  get spilledCount() {
    return this.spilled.size;
  }

  /** Frame buffers allocated and not handed over or pooled (for tests). */
  get pooled() {
    return this.pool.length;
  }

  /** Done: a decoder held back is let go (its frames are dropped) and the spill file closed. */
  async close() {
    this.closed = true;
    this.letDecoderOn();
    await this.file?.close();
    this.file = null;
  }
}
