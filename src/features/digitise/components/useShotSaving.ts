import { useEffect, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { landmarkLabels, eventLabels } from "@shared/schemas/shots";
import { clipChanged } from "@/entities/clip";
import { shotMarksSaved } from "@/entities/shot";
import { toast } from "@/components/ui/toast-store";
import type { ShotDetail, StoredResult } from "@shared/schemas/shots";
import { useRecomputedResult } from "@/lib/recompute";
import { fetchShot } from "../api/shot";
import { saveCalibration, saveMarks } from "../api/saveMarks";
import { Autosave, readLocal, recover, type AutosaveStatus, type MergeNotice } from "../model/autosave";
import type { MergePart } from "../model/merge";
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

const partLabel = (p: MergePart) => (p in landmarkLabels ? landmarkLabels[p as keyof typeof landmarkLabels] : eventLabels[p as keyof typeof eventLabels]).toLowerCase();
const partList = (parts: MergePart[]) => parts.map(partLabel).join(", ");

/** What a merge did, in one sentence: nothing anyone saved is dropped without saying so. */
export function mergeMessage(n: Pick<MergeNotice, "savedBy" | "theirs" | "replaced">): string {
  const who = n.savedBy ?? "Someone";
  const kept = n.theirs.length ? `${who}'s ${partList(n.theirs)} kept with your edits` : `${who}'s save merged with your edits`;
  return n.replaced.length ? `${kept}; your ${partList(n.replaced)} replaced theirs.` : `${kept}.`;
}

/**
 * Autosave of marks and events (versioned) and of the clip's calibration, wired to the store.
 * Read-only shots get no saver at all.
 */
export function useShotSaving(teamId: string, shot: ShotDetail, store: DigitiseStore, start: ReturnType<typeof initialDoc>) {
  const [status, setStatus] = useState<AutosaveStatus | null>(shot.canEdit ? { kind: "saved", version: shot.version } : null);
  const [calStatus, setCalStatus] = useState<CalibrationStatus>({ kind: "saved" });
  const [stored, setStored] = useState<StoredResult | null>(shot.storedResult);
  useRecomputedResult(stored, () => fetchShot(teamId, shot.id), setStored);
  const [saver, setSaver] = useState<{ marks: Autosave; cal: CalibrationSaver } | null>(null);
  const qc = useQueryClient();

  useEffect(() => {
    if (!shot.canEdit) return;
    const marks = new Autosave(
      {
        shotId: shot.id,
        send: (body, opts) => saveMarks(teamId, shot.id, body, opts),
        fetchCurrent: () => fetchShot(teamId, shot.id),
        storage: storage(),
        onStatus: setStatus,
        onSaved: (r, saved) => {
          if (r.storedResult) setStored(r.storedResult);
          // Written through: coming back starts from this version, and the other pages refetch.
          void shotMarksSaved(qc, teamId, shot.id, saved, r);
        },
        onMerged: (n) => {
          store.replaceDoc({ ...store.getState().doc, marks: n.content.marks, events: n.content.events });
          toast.info(mergeMessage(n));
        },
      },
      shot,
    );
    const cal = new CalibrationSaver(
      {
        clipId: shot.clip.id,
        send: async (c) => {
          await saveCalibration(teamId, shot.clip.id, c);
          // Every shot of the clip gets new numbers (on the job queue: they say "recomputing" until then): every view of shots refetches.
          void clipChanged(qc, teamId);
          const fresh = await fetchShot(teamId, shot.id).catch(() => null);
          if (fresh?.storedResult) setStored(fresh.storedResult);
        },
        storage: storage(),
        onStatus: setCalStatus,
      },
      shot.clip.calibration,
    );
    const r = start.recovery;
    if (r.action === "restore") {
      marks.adoptRecovered(r.content, r.baseVersion);
      if (r.mergedTheirs.length) toast.info(mergeMessage({ savedBy: shot.updatedByName, theirs: r.mergedTheirs, replaced: [] }));
    }
    if (r.action === "conflict")
      marks.holdConflict(r.content, r.base, r.overlaps, { currentVersion: shot.version, savedBy: shot.updatedByName, savedAt: shot.updatedAt });
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
      cal.stop(); // its retry timer must not outlive the page
    };
    // One saver per shot for the life of the page.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [shot.id]);

  /** After a conflict: our edits win where both changed the same parts; everything else of theirs stays. */
  const keepMine = () => saver?.marks.keepMine();
  /** After a conflict: their marks win where both changed the same parts; our other edits stay. */
  const takeTheirs = () => saver?.marks.takeTheirs();

  return { status, calStatus, stored, version: saver?.marks.version ?? shot.version, keepMine, takeTheirs };
}
