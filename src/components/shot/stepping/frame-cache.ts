// Decoded frames around the one on screen, so stepping draws from memory instead of waiting on
// the network: frames ahead in the direction of travel first, then a few behind. Far frames are
// dropped (and their bitmaps closed) once the cache is over its budget; loads that fell out of the
// window are cancelled. The loader is injected, so the policy is tested without a browser.

export interface Closable {
  close?(): void;
}

export interface FrameCacheOptions<T extends Closable> {
  load(frame: number, signal: AbortSignal): Promise<T>;
  first: number;
  last: number;
  /** Decoded frames kept at most. */
  capacity?: number;
  ahead?: number;
  behind?: number;
  /** Loads in flight at once. */
  concurrency?: number;
}

interface Entry<T> {
  value?: T;
  promise: Promise<T>;
  controller: AbortController;
  started: boolean;
  run(): void;
}

/** Frames that fit a memory budget (decoded RGBA), within sane bounds. */
export function capacityFor(width: number, height: number, budgetBytes = 192 * 1024 * 1024): number {
  return Math.max(12, Math.min(96, Math.floor(budgetBytes / Math.max(1, width * height * 4))));
}

export class FrameCache<T extends Closable> {
  private entries = new Map<number, Entry<T>>();
  private queue: number[] = [];
  private running = 0;
  private focusFrame: number;
  private keep = new Set<number>();
  private dir: 1 | -1 = 1;
  private listeners = new Set<(frame: number) => void>();
  private readonly o: Required<FrameCacheOptions<T>>;
  private disposed = false;

  constructor(opts: FrameCacheOptions<T>) {
    this.o = { capacity: 48, ahead: 24, behind: 8, concurrency: 6, ...opts };
    this.focusFrame = opts.first;
  }

  /** The decoded frame, if it is in memory. */
  get(frame: number): T | undefined {
    return this.entries.get(frame)?.value;
  }

  has(frame: number) {
    return this.entries.get(frame)?.value !== undefined;
  }

  get size() {
    let n = 0;
    for (const e of this.entries.values()) if (e.value !== undefined) n++;
    return n;
  }

  onLoaded(l: (frame: number) => void) {
    this.listeners.add(l);
    return () => void this.listeners.delete(l);
  }

  /** The order frames are wanted in when looking at `frame` while moving in `dir`. */
  window(frame: number, dir: 1 | -1): number[] {
    const out = [frame];
    for (let i = 1; i <= this.o.ahead; i++) out.push(frame + dir * i);
    for (let i = 1; i <= this.o.behind; i++) out.push(frame - dir * i);
    return out.filter((f) => f >= this.o.first && f <= this.o.last);
  }

  /** Look at `frame`: it loads first, then the window around it. Resolves with the decoded frame. */
  focus(frame: number, dir?: 1 | -1): Promise<T> {
    if (dir) this.dir = dir;
    else if (frame !== this.focusFrame) this.dir = frame > this.focusFrame ? 1 : -1;
    this.focusFrame = frame;
    const wanted = this.window(frame, this.dir);
    const keep = (this.keep = new Set(wanted));
    // Cancel loads nobody wants any more; they would only delay the ones that matter.
    for (const [f, e] of this.entries) {
      if (!keep.has(f) && e.value === undefined) {
        e.controller.abort();
        this.entries.delete(f);
      }
    }
    this.queue = [];
    for (const f of wanted) {
      if (!this.entries.has(f)) this.entries.set(f, this.entry(f));
      const e = this.entries.get(f)!;
      if (!e.started) this.queue.push(f);
    }
    this.evict(keep);
    this.pump();
    return this.entries.get(frame)?.promise ?? Promise.reject(new RangeError(`frame ${frame} is outside ${this.o.first}–${this.o.last}`));
  }

  private entry(frame: number): Entry<T> {
    const controller = new AbortController();
    let resolve!: (v: T) => void;
    let reject!: (e: unknown) => void;
    const promise = new Promise<T>((res, rej) => {
      resolve = res;
      reject = rej;
    });
    promise.catch(() => {});
    const e: Entry<T> = { promise, controller, started: false, run: () => {} };
    e.run = () => {
      e.started = true;
      this.running++;
      this.o
        .load(frame, controller.signal)
        .then((v) => {
          if (this.disposed || this.entries.get(frame) !== e) {
            v.close?.();
            reject(new DOMException("dropped", "AbortError"));
            return;
          }
          e.value = v;
          this.evict(this.keep);
          resolve(v);
          for (const l of this.listeners) l(frame);
        })
        .catch((err) => {
          if (this.entries.get(frame) === e) this.entries.delete(frame); // a later focus tries again
          reject(err);
        })
        .finally(() => {
          this.running--;
          this.pump();
        });
    };
    return e;
  }

  private pump() {
    while (!this.disposed && this.running < this.o.concurrency && this.queue.length) {
      const f = this.queue.shift()!;
      const e = this.entries.get(f);
      if (e && !e.started) e.run();
    }
  }

  /** Over capacity: drop decoded frames farthest from the focus, never one in the window. */
  private evict(keep: Set<number>) {
    const ready = [...this.entries].filter(([, e]) => e.value !== undefined);
    let over = ready.length - this.o.capacity;
    if (over <= 0) return;
    ready.sort((a, b) => Math.abs(b[0] - this.focusFrame) - Math.abs(a[0] - this.focusFrame));
    for (const [f, e] of ready) {
      if (over <= 0) break;
      if (keep.has(f)) continue;
      e.value!.close?.();
      this.entries.delete(f);
      over--;
    }
  }

  dispose() {
    this.disposed = true;
    for (const e of this.entries.values()) {
      e.controller.abort();
      e.value?.close?.();
    }
    this.entries.clear();
    this.queue = [];
  }
}
