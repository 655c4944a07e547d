import { useEffect, useState } from "react";
import type { ShotDetail, StoredResult } from "@shared/schemas/shots";
import { fetchShot } from "../api/shot";
import { saveCalibration, saveMarks } from "../api/saveMarks";
import { Autosave, readLocal, recover, type AutosaveStatus } from "../model/autosave";
import { checkDraft, draftFromClip } from "../model/calibration-draft";
import { CalibrationSaver, type CalibrationStatus } from "../model/calibration-save";
import type { DigitiseDoc, DigitiseStore } from "../model/store";

const storage = (): Storage | null => {
  try {
    return window.localStorage;
  } catch {
    return null;
  }
};

/** The document to open with: the server's, or edits left in this browser by an earlier visit. */
export function initialDoc(shot: ShotDetail): { doc: DigitiseDoc; recovery: ReturnType<typeof recover>; calRecovered: boolean } {
  const recovery = shot.canEdit ? recover(readLocal(storage(), shot.id), shot) : { action: "none" as const };
  const content = recovery.action === "none" ? shot : recovery.content;
  const saver = shot.canEdit ? new CalibrationSaver({ clipId: shot.clip.id, send: async () => {}, storage: storage() }, shot.clip.calibration) : null;
  const cal = saver?.recover();
  return {
    doc: { marks: content.marks, events: content.events, calibration: draftFromClip(cal === undefined ? shot.clip.calibration : cal) },
    recovery,
    calRecovered: cal !== undefined,
  };
}

/**
 * Autosave of marks and events (versioned) and of the clip's calibration, wired to the store.
 * Read-only shots get no saver at all.
 */
export function useShotSaving(teamId: string, shot: ShotDetail, store: DigitiseStore, start: ReturnType<typeof initialDoc>) {
  const [status, setStatus] = useState<AutosaveStatus | null>(shot.canEdit ? { kind: "saved", version: shot.version } : null);
  const [calStatus, setCalStatus] = useState<CalibrationStatus>({ kind: "saved" });
  const [stored, setStored] = useState<StoredResult | null>(shot.storedResult);
  const [saver, setSaver] = useState<{ marks: Autosave; cal: CalibrationSaver } | null>(null);

  useEffect(() => {
    if (!shot.canEdit) return;
    const marks = new Autosave(
      {
        shotId: shot.id,
        send: (body, opts) => saveMarks(teamId, shot.id, body, opts),
        fetchCurrent: () => fetchShot(teamId, shot.id),
        storage: storage(),
        onStatus: setStatus,
        onSaved: (r) => r.storedResult && setStored(r.storedResult),
      },
      shot,
    );
    const cal = new CalibrationSaver(
      {
        clipId: shot.clip.id,
        send: async (c) => {
          await saveCalibration(teamId, shot.clip.id, c);
          // The server recomputed every shot of the clip: pick up this one's result.
          const fresh = await fetchShot(teamId, shot.id).catch(() => null);
          if (fresh?.storedResult) setStored(fresh.storedResult);
        },
        storage: storage(),
        onStatus: setCalStatus,
      },
      shot.clip.calibration,
    );
    const r = start.recovery;
    if (r.action === "restore") marks.adoptRecovered(r.content, r.baseVersion);
    if (r.action === "conflict") {
      const local = readLocal(storage(), shot.id);
      marks.holdConflict(r.content, local?.baseVersion ?? shot.version, { currentVersion: shot.version, savedBy: shot.updatedByName, savedAt: shot.updatedAt });
    }
    if (start.calRecovered) {
      const check = checkDraft(store.getState().doc.calibration, store.getState().frameSize);
      if (check.state === "ready" || check.state === "none") cal.set(check.calibration);
    }
    const off = store.onDocChange((doc) => {
      marks.edit({ marks: doc.marks, events: doc.events });
      const check = checkDraft(doc.calibration, store.getState().frameSize);
      if (check.state === "ready" || check.state === "none") cal.set(check.calibration);
    });
    const online = () => {
      marks.online();
      cal.online();
    };
    const hide = () => marks.flush({ keepalive: true });
    const onVisibility = () => document.visibilityState === "hidden" && hide();
    window.addEventListener("online", online);
    window.addEventListener("pagehide", hide);
    document.addEventListener("visibilitychange", onVisibility);
    setSaver({ marks, cal });
    return () => {
      off();
      window.removeEventListener("online", online);
      window.removeEventListener("pagehide", hide);
      document.removeEventListener("visibilitychange", onVisibility);
      marks.flush({ keepalive: true });
      marks.stop();
    };
    // One saver per shot for the life of the page.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [shot.id]);

  /** After a conflict: keep the local edits and save them over the other version, on purpose. */
  const keepMine = () => {
    if (status?.kind === "conflict") saver?.marks.keepMine(status.conflict.currentVersion);
  };
  /** After a conflict: take the server's copy and drop the local edits. */
  const takeTheirs = async () => {
    if (!saver) return;
    const fresh = await fetchShot(teamId, shot.id);
    store.replaceDoc({ ...store.getState().doc, marks: fresh.marks, events: fresh.events });
    saver.marks.takeTheirs(fresh);
    if (fresh.storedResult) setStored(fresh.storedResult);
  };

  return { status, calStatus, stored, version: saver?.marks.version ?? shot.version, keepMine, takeTheirs };
}
