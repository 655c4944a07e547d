import type { ClipCalibration } from "@shared/schemas/shots";
import { RETRY_MS, SaveError, type KeyValueStore, type Timers } from "./autosave";

// The clip's calibration has no version of its own: the latest complete one wins. It is kept in
// local storage with the server copy it replaced, so after a reload it is only sent again when the
// server still holds that copy (someone else's newer calibration is never overwritten blindly).

export type CalibrationStatus = { kind: "saved" } | { kind: "saving" } | { kind: "offline" } | { kind: "error"; message: string };

interface CalRecord {
  v: 1;
  value: ClipCalibration | null;
  /** The server's calibration when the edit was made. */
  base: string;
}

export const calKey = (clipId: string) => `loadframe.calibration.${clipId}`;
const text = (c: ClipCalibration | null) => JSON.stringify(c);

export interface CalibrationSaverDeps {
  clipId: string;
  send(c: ClipCalibration | null): Promise<unknown>;
  storage: KeyValueStore | null;
  timers?: Timers;
  onStatus?(s: CalibrationStatus): void;
}

export class CalibrationSaver {
  private server: string;
  private wanted: string;
  private value: ClipCalibration | null;
  private attempt = 0;
  private timer: unknown = null;
  private busy = false;
  private stopped = false;
  private readonly timers: Timers;
  status: CalibrationStatus = { kind: "saved" };

  constructor(
    private readonly deps: CalibrationSaverDeps,
    serverValue: ClipCalibration | null,
  ) {
    this.timers = deps.timers ?? { set: (fn, ms) => setTimeout(fn, ms), clear: (id) => clearTimeout(id as ReturnType<typeof setTimeout>) };
    this.server = this.wanted = text(serverValue);
    this.value = serverValue;
  }

  /** A calibration left unsaved by an earlier visit, if the server has not changed since. */
  recover(): ClipCalibration | null | undefined {
    try {
      const raw = this.deps.storage?.getItem(calKey(this.deps.clipId));
      if (!raw) return undefined;
      const r = JSON.parse(raw) as CalRecord;
      if (r.v !== 1 || r.base !== this.server || text(r.value) === this.server) {
        this.deps.storage?.removeItem(calKey(this.deps.clipId));
        return undefined;
      }
      return r.value;
    } catch {
      return undefined;
    }
  }

  get dirty() {
    return this.wanted !== this.server;
  }

  private setStatus(s: CalibrationStatus) {
    this.status = s;
    this.deps.onStatus?.(s);
  }

  set(value: ClipCalibration | null) {
    if (this.stopped) return;
    this.value = value;
    this.wanted = text(value);
    try {
      if (this.dirty) this.deps.storage?.setItem(calKey(this.deps.clipId), JSON.stringify({ v: 1, value, base: this.server } satisfies CalRecord));
      else this.deps.storage?.removeItem(calKey(this.deps.clipId));
    } catch {
      /* the server save still runs */
    }
    if (!this.dirty) {
      if (!this.busy) this.setStatus({ kind: "saved" });
      return;
    }
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = this.timers.set(() => void this.send(), 300);
  }

  online() {
    if (this.status.kind === "offline") void this.send();
  }

  /** The page is gone: no retry may fire after it (the local copy stays for the next visit). */
  stop() {
    this.stopped = true;
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
  }

  private async send() {
    this.timer = null;
    if (this.stopped || this.busy || !this.dirty) return;
    this.busy = true;
    const sending = this.wanted;
    const value = this.value;
    this.setStatus({ kind: "saving" });
    try {
      await this.deps.send(value);
      this.server = sending;
      this.attempt = 0;
      if (!this.dirty) this.deps.storage?.removeItem(calKey(this.deps.clipId));
      this.busy = false;
      if (this.dirty) void this.send();
      else this.setStatus({ kind: "saved" });
    } catch (e) {
      this.busy = false;
      const f = e instanceof SaveError ? e.failure : { kind: "network" as const };
      if (f.kind === "refused") {
        this.setStatus({ kind: "error", message: f.message });
        return;
      }
      const ms = RETRY_MS[Math.min(this.attempt++, RETRY_MS.length - 1)];
      this.setStatus({ kind: "offline" });
      if (!this.stopped) this.timer = this.timers.set(() => void this.send(), ms);
    }
  }
}
