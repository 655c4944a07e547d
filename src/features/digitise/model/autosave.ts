import { mergeMarks, type MergePart } from "./merge";
import { canonicalMarks, type SaveMarksBody, type SaveMarksResponse, type ShotEventsDraft, type ShotMarks, type VersionConflict } from "@shared/schemas/shots";

// Autosave of a shot's marks and events, as a small state machine:
//
//   saved ──edit──▶ pending ──debounce──▶ saving ──ok──▶ saved (or saving again if edits came in)
//                                          ├──network / 5xx──▶ offline ──retry, or "online"──▶ saving
//                                          ├──409──▶ our own earlier save? go on. Else merge per landmark
//                                          │          with what was saved meanwhile: no overlap ▶ saving;
//                                          │          an overlap ▶ conflict (the analyst chooses)
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
  /** Both sides changed `overlaps` differently; the rest is merged already. */
  | { kind: "conflict"; conflict: VersionConflict; overlaps: MergePart[] }
  | { kind: "error"; message: string };

/** What a merge with someone else's save did, for the page to show and apply. */
export interface MergeNotice {
  content: MarksContent;
  savedBy: string | null;
  /** Parts taken from the other save. */
  theirs: MergePart[];
  /** Parts where the analyst's choice replaced the other save's marks. */
  replaced: MergePart[];
}

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
  /** The server now holds `saved` at `r.version`. */
  onSaved?(r: SaveMarksResponse, saved: MarksContent): void;
  /** The working document changed by a merge: the page shows `content` from now on. */
  onMerged?(n: MergeNotice): void;
}

/** What local storage holds for a shot with unsaved edits. */
export interface LocalRecord {
  v: 1;
  baseVersion: number;
  content: MarksContent;
  /** What the server held at baseVersion, so a later visit can merge per landmark. */
  base?: MarksContent;
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
  /** Local edits to put back and save, on top of `baseVersion` (merged per landmark when the server moved on). */
  | { action: "restore"; content: MarksContent; baseVersion: number; mergedTheirs: MergePart[] }
  /** Local edits made on an older version that someone else has since changed in the same places. */
  | { action: "conflict"; content: MarksContent; base: MarksContent | null; overlaps: MergePart[] };

/** On opening a shot: what to do with edits left in local storage by an earlier visit. */
export function recover(local: LocalRecord | null, server: MarksContent & { version: number }): Recovery {
  if (!local) return { action: "none" };
  const serverKey = contentKey(server);
  if (contentKey(local.content) === serverKey) return { action: "none" };
  if (local.baseVersion === server.version || local.sentKeys.includes(serverKey))
    return { action: "restore", content: local.content, baseVersion: server.version, mergedTheirs: [] };
  if (local.base) {
    const m = mergeMarks(local.base, local.content, server);
    if (!m.overlaps.length) return { action: "restore", content: m.content, baseVersion: server.version, mergedTheirs: m.theirsOnly };
    return { action: "conflict", content: local.content, base: local.base, overlaps: m.overlaps };
  }
  return { action: "conflict", content: local.content, base: null, overlaps: [] };
}

const browserTimers: Timers = { set: (fn, ms) => setTimeout(fn, ms), clear: (id) => clearTimeout(id as ReturnType<typeof setTimeout>) };

export class Autosave {
  private baseVersion: number;
  private content: MarksContent;
  private key: string;
  /** Content the server is known to hold at baseVersion. */
  private ackedKey: string;
  private acked: MarksContent;
  /** The other save while a conflict is held. */
  private theirs: (MarksContent & { version: number; savedBy: string | null }) | null = null;
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
    this.content = this.acked = { marks: server.marks, events: server.events };
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
        const r: LocalRecord = { v: 1, baseVersion: this.baseVersion, content: this.content, base: this.acked, sentKeys: this.sentKeys, savedAt: Date.now() };
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

  /**
   * Local edits from an earlier visit clash with a newer server version (`theirs`, which this
   * saver was made with): hold them until the analyst chooses. `base` is what they were made on.
   */
  holdConflict(content: MarksContent, base: MarksContent | null, overlaps: MergePart[], conflict: VersionConflict) {
    this.theirs = { ...this.acked, version: this.baseVersion, savedBy: conflict.savedBy };
    // Without the base (a record from before bases were kept) every part counts as overlapping.
    this.acked = base ?? { marks: {}, events: {} };
    this.content = content;
    this.key = contentKey(content);
    this.persist();
    this.setStatus({ kind: "conflict", conflict, overlaps });
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
      this.acked = { marks: body.marks, events: body.events };
      this.sentKeys = [];
      this.persist();
      this.deps.onSaved?.(r, this.acked);
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
    let cur: (MarksContent & { version: number }) | null = null;
    try {
      cur = await this.deps.fetchCurrent();
    } catch {
      // fall through to the conflict: the analyst decides
    }
    if (cur && this.sentKeys.includes(contentKey(cur)) && contentKey(cur) !== key) {
      this.adoptServer(cur);
      this.schedule(0);
      return;
    }
    if (!cur) return this.setStatus({ kind: "conflict", conflict: f.conflict, overlaps: [] });
    // Someone else saved: merge per landmark. Parts only they changed are kept, parts only we
    // changed are saved on top; only parts both changed differently wait for the analyst.
    const theirs = { ...cur, savedBy: f.conflict.savedBy };
    const m = mergeMarks(this.acked, this.content, cur);
    if (m.overlaps.length) {
      this.theirs = theirs;
      return this.setStatus({ kind: "conflict", conflict: f.conflict, overlaps: m.overlaps });
    }
    this.applyMerge(theirs, m.content, m.theirsOnly, []);
  }

  /** The server's copy becomes the base of further saves. */
  private adoptServer(server: MarksContent & { version: number }) {
    this.baseVersion = server.version;
    this.acked = { marks: server.marks, events: server.events };
    this.ackedKey = contentKey(server);
    this.sentKeys = [];
  }

  /** Continue from a merge with `theirs`: the page shows `content`, which is saved on top. */
  private applyMerge(theirs: MarksContent & { version: number; savedBy: string | null }, content: MarksContent, fromTheirs: MergePart[], replaced: MergePart[]) {
    this.theirs = null;
    this.adoptServer(theirs);
    this.content = content;
    this.key = contentKey(content);
    this.persist();
    this.deps.onMerged?.({ content, savedBy: theirs.savedBy, theirs: fromTheirs, replaced });
    if (this.dirty) {
      this.setStatus({ kind: "pending" });
      this.schedule(0);
    } else this.setStatus({ kind: "saved", version: this.baseVersion });
  }

  /** The other save held by a conflict, fetched now if the conflict could not read it then. */
  private async otherSave() {
    if (this.statusNow.kind !== "conflict") return null;
    if (this.theirs) return this.theirs;
    const cur = await this.deps.fetchCurrent();
    return { ...cur, savedBy: this.statusNow.conflict.savedBy };
  }

  /** After a conflict: our edits win where both changed the same parts; the other save's other parts stay. */
  async keepMine() {
    const t = await this.otherSave();
    if (!t) return;
    const m = mergeMarks(this.acked, this.content, t, "mine");
    this.applyMerge(t, m.content, m.theirsOnly, m.overlaps);
  }

  /** After a conflict: the other save wins where both changed the same parts; our other edits stay. */
  async takeTheirs() {
    const t = await this.otherSave();
    if (!t) return;
    const m = mergeMarks(this.acked, this.content, t, "theirs");
    this.applyMerge(t, m.content, [...m.theirsOnly, ...m.overlaps], []);
  }

  stop() {
    this.stopped = true;
    this.cancelTimer();
  }
}
