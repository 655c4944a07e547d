// The shot's grey frames between the decoder and the tracker. The decoder runs ahead; the tracker
// takes each frame once (back from the seed frame, then on from it). Frames wait in memory up to a
// budget and beyond it in a file in the job's folder, so a long 4K shot does not exhaust memory.
import { open, type FileHandle } from "node:fs/promises";
import path from "node:path";
import type { FrameSource, GrayFrame } from "../../shared/tracking/types";

export class FrameStore implements FrameSource {
  readonly length: number;
  private readonly bytes: number;
  private readonly memory = new Map<number, Uint8Array>();
  private readonly spilled = new Set<number>();
  private readonly waiters = new Map<number, { resolve: () => void; reject: (e: unknown) => void }[]>();
  private inMemory = 0;
  private file: FileHandle | null = null;
  private ended: { error?: unknown } | null = null;
  private taken = new Set<number>();

  constructor(
    private readonly o: { first: number; last: number; width: number; height: number; budgetBytes: number; spillDir: string },
  ) {
    this.length = o.last + 1;
    this.bytes = o.width * o.height;
  }

  /** A decoded frame; spilled to the file once the memory budget is used. */
  async put(index: number, data: Uint8Array) {
    if (this.inMemory + this.bytes <= this.o.budgetBytes) {
      this.memory.set(index, data);
      this.inMemory += this.bytes;
    } else {
      this.file ??= await open(path.join(this.o.spillDir, "frames.gray"), "w+");
      await this.file.write(data, 0, this.bytes, (index - this.o.first) * this.bytes);
      this.spilled.add(index);
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
      return { width, height, data: inMemory };
    }
    this.spilled.delete(index);
    const data = new Uint8Array(this.bytes);
    await this.file!.read(data, 0, this.bytes, (index - this.o.first) * this.bytes);
    return { width, height, data };
  }

  /** Frames held in memory right now (for tests and logs). */
  get heldInMemory() {
    return this.memory.size;
  }

  get spilledCount() {
    return this.spilled.size;
  }

  async close() {
    await this.file?.close();
    this.file = null;
  }
}
