import { canonicalMarks, type SaveMarksBody, type SaveMarksResponse, type ShotEventsDraft, type ShotMarks, type VersionConflict } from "@shared/schemas/shots";

// Autosave of a shot's marks and events, as a small state machine:
//
//   saved ──edit──▶ pending ──debounce──▶ saving ──ok──▶ saved (or saving again if edits came in)
//                                          ├──network / 5xx──▶ offline ──retry, or "online"──▶ saving
//                                          ├──409──▶ (was it our own earlier save? then go on) ▶ conflict
//                                          └──422 / 403──▶ error
//
// Every edit is written to local storage before anything goes on the network, so a reload, a
// closed tab or a dead server loses nothing; the record is removed once the server has the same
// content. Each save sends the whole document with the version it started from: sending it twice
// is harmless (the server answers an identical document with its current version).

export interface MarksContent {
  marks: ShotMarks;
  events: ShotEventsDraft;
}

export type SaveFailure =
  | { kind: "network" }
  | { kind: "server"; message: string }
  | { kind: "conflict"; conflict: VersionConflict }
  | { kind: "refused"; message: string };

export class SaveError extends Error {
  constructor(readonly failure: SaveFailure) {
    super(failure.kind === "network" ? "network" : failure.kind === "conflict" ? "version_conflict" : failure.message);
  }
}

export type AutosaveStatus =
  | { kind: "saved"; version: number }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "offline"; attempt: number; retryInMs: number }
  | { kind: "conflict"; conflict: VersionConflict }
  | { kind: "error"; message: string };

export interface Timers {
  set(fn: () => void, ms: number): unknown;
  clear(id: unknown): void;
}

export interface KeyValueStore {
  getItem(k: string): string | null;
  setItem(k: string, v: string): void;
  removeItem(k: string): void;
}

export interface AutosaveDeps {
  shotId: string;
  send(body: SaveMarksBody, opts?: { keepalive?: boolean }): Promise<SaveMarksResponse>;
  /** The server's copy, to tell our own lost save from someone else's. */
  fetchCurrent(): Promise<MarksContent & { version: number }>;
  storage: KeyValueStore | null;
  timers?: Timers;
  debounceMs?: number;
  onStatus?(s: AutosaveStatus): void;
  onSaved?(r: SaveMarksResponse): void;
}

/** What local storage holds for a shot with unsaved edits. */
export interface LocalRecord {
  v: 1;
  baseVersion: number;
  content: MarksContent;
  /** Keys of documents sent whose answer never came: if the server has one of them, it was ours. */
  sentKeys: string[];
  savedAt: number;
}

export const localKey = (shotId: string) => `loadframe.digitise.${shotId}`;
export const contentKey = (c: MarksContent) => canonicalMarks(c.marks, c.events).key;
export const RETRY_MS = [1000, 2000, 4000, 8000, 15000];

export function readLocal(storage: KeyValueStore | null, shotId: string): LocalRecord | null {
  try {
    const raw = storage?.getItem(localKey(shotId));
    if (!raw) return null;
    const r = JSON.parse(raw) as LocalRecord;
    return r?.v === 1 && r.content && typeof r.baseVersion === "number" ? r : null;
  } catch {
    return null;
  }
}

export type Recovery =
  | { action: "none" }
  /** Local edits to put back and save, on top of `baseVersion`. */
  | { action: "restore"; content: MarksContent; baseVersion: number }
  /** Local edits made on an older version that someone else has since changed. */
  | { action: "conflict"; content: MarksContent };

/** On opening a shot: what to do with edits left in local storage by an earlier visit. */
export function recover(local: LocalRecord | null, server: MarksContent & { version: number }): Recovery {
  if (!local) return { action: "none" };
  const serverKey = contentKey(server);
  if (contentKey(local.content) === serverKey) return { action: "none" };
  if (local.baseVersion === server.version || local.sentKeys.includes(serverKey)) return { action: "restore", content: local.content, baseVersion: server.version };
  return { action: "conflict", content: local.content };
}

const browserTimers: Timers = { set: (fn, ms) => setTimeout(fn, ms), clear: (id) => clearTimeout(id as ReturnType<typeof setTimeout>) };

export class Autosave {
  private baseVersion: number;
  private content: MarksContent;
  private key: string;
  /** Content the server is known to hold at baseVersion. */
  private ackedKey: string;
  private sentKeys: string[] = [];
  private inFlight: Promise<void> | null = null;
  private timer: unknown = null;
  private attempt = 0;
  private statusNow: AutosaveStatus;
  private readonly timers: Timers;
  private readonly debounceMs: number;
  private stopped = false;

  constructor(
    private readonly deps: AutosaveDeps,
    server: MarksContent & { version: number },
  ) {
    this.timers = deps.timers ?? browserTimers;
    this.debounceMs = deps.debounceMs ?? 600;
    this.baseVersion = server.version;
    this.content = server;
    this.key = this.ackedKey = contentKey(server);
    this.statusNow = { kind: "saved", version: server.version };
  }

  get status() {
    return this.statusNow;
  }
  get version() {
    return this.baseVersion;
  }
  /** True while local edits are not yet on the server. */
  get dirty() {
    return this.key !== this.ackedKey;
  }

  private setStatus(s: AutosaveStatus) {
    this.statusNow = s;
    this.deps.onStatus?.(s);
  }

  private persist() {
    if (!this.deps.storage) return;
    try {
      if (!this.dirty) this.deps.storage.removeItem(localKey(this.deps.shotId));
      else {
        const r: LocalRecord = { v: 1, baseVersion: this.baseVersion, content: this.content, sentKeys: this.sentKeys, savedAt: Date.now() };
        this.deps.storage.setItem(localKey(this.deps.shotId), JSON.stringify(r));
      }
    } catch {
      // A full or blocked local storage must not stop the server save.
    }
  }

  /** Start from a recovered local copy (see recover()). */
  adoptRecovered(content: MarksContent, baseVersion: number) {
    this.baseVersion = baseVersion;
    this.edit(content);
  }

  /** Local edits from an earlier visit clash with a newer server version: hold them until the analyst chooses. */
  holdConflict(content: MarksContent, baseVersion: number, conflict: VersionConflict) {
    this.content = content;
    this.key = contentKey(content);
    this.baseVersion = baseVersion;
    this.setStatus({ kind: "conflict", conflict });
  }

  /** A new state of the document; saved after a pause in editing. */
  edit(content: MarksContent) {
    if (this.stopped) return;
    this.content = content;
    this.key = contentKey(content);
    this.persist();
    if (this.statusNow.kind === "conflict") return; // held until the analyst chooses
    if (!this.dirty) {
      this.cancelTimer();
      if (!this.inFlight) this.setStatus({ kind: "saved", version: this.baseVersion });
      return;
    }
    if (this.statusNow.kind === "offline") return; // the retry timer sends the latest
    this.setStatus(this.inFlight ? { kind: "saving" } : { kind: "pending" });
    this.schedule(this.debounceMs);
  }

  private cancelTimer() {
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
  }

  private schedule(ms: number) {
    this.cancelTimer();
    this.timer = this.timers.set(() => {
      this.timer = null;
      void this.send();
    }, ms);
  }

  /** Send now (the page is being hidden or closed). */
  flush(opts: { keepalive?: boolean } = {}) {
    if (!this.dirty || this.statusNow.kind === "conflict") return;
    this.cancelTimer();
    void this.send(opts);
  }

  /** The browser says the network is back. */
  online() {
    if (this.statusNow.kind === "offline") {
      this.cancelTimer();
      void this.send();
    }
  }

  private async send(opts: { keepalive?: boolean } = {}): Promise<void> {
    if (this.stopped || !this.dirty) return;
    if (this.inFlight) {
      await this.inFlight;
      return this.send(opts);
    }
    const key = this.key;
    const body: SaveMarksBody = { baseVersion: this.baseVersion, marks: this.content.marks, events: this.content.events };
    if (!this.sentKeys.includes(key)) this.sentKeys.push(key);
    this.persist();
    this.setStatus({ kind: "saving" });
    let done!: () => void;
    this.inFlight = new Promise((r) => (done = r));
    try {
      const r = await this.deps.send(body, opts);
      this.attempt = 0;
      this.baseVersion = r.version;
      this.ackedKey = key;
      this.sentKeys = [];
      this.persist();
      this.deps.onSaved?.(r);
      if (this.dirty) this.schedule(0);
      else this.setStatus({ kind: "saved", version: r.version });
    } catch (e) {
      await this.failed(e, key);
    } finally {
      this.inFlight = null;
      done();
    }
  }

  private async failed(e: unknown, key: string) {
    const f: SaveFailure = e instanceof SaveError ? e.failure : { kind: "network" };
    if (f.kind === "network" || f.kind === "server") {
      const retryInMs = RETRY_MS[Math.min(this.attempt, RETRY_MS.length - 1)];
      this.attempt++;
      this.setStatus({ kind: "offline", attempt: this.attempt, retryInMs });
      this.schedule(retryInMs);
      return;
    }
    if (f.kind === "refused") {
      this.setStatus({ kind: "error", message: f.message });
      return;
    }
    // 409: if the server holds something we sent earlier (its answer was lost), build on it.
    try {
      const cur = await this.deps.fetchCurrent();
      if (this.sentKeys.includes(contentKey(cur)) && contentKey(cur) !== key) {
        this.baseVersion = cur.version;
        this.ackedKey = contentKey(cur);
        this.sentKeys = [];
        this.persist();
        this.schedule(0);
        return;
      }
    } catch {
      // fall through to the conflict: the analyst decides
    }
    this.setStatus({ kind: "conflict", conflict: f.conflict });
  }

  /** After a conflict: save these edits on top of the other person's version, on purpose. */
  keepMine(currentVersion: number) {
    this.baseVersion = currentVersion;
    this.sentKeys = [];
    this.setStatus({ kind: "pending" });
    this.persist();
    this.schedule(0);
  }

  /** After a conflict: drop local edits and take the server's copy. */
  takeTheirs(server: MarksContent & { version: number }) {
    this.cancelTimer();
    this.baseVersion = server.version;
    this.content = server;
    this.key = this.ackedKey = contentKey(server);
    this.sentKeys = [];
    this.persist();
    this.setStatus({ kind: "saved", version: server.version });
  }

  stop() {
    this.stopped = true;
    this.cancelTimer();
  }
}
