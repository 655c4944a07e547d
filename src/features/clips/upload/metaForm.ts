import { ClipMetaSchema, type CameraView, type ClipMeta, type ShotType } from "@shared/schemas/clips";
import type { FieldProblem } from "@/lib/api";
import { todayIso } from "@/lib/format";

/** The clip form as typed (strings); turned into the shared ClipMeta and checked with its schema. */
export interface MetaFormValues {
  title: string;
  /** An existing session's id, or "new". */
  session: string;
  newDate: string;
  newVenue: string;
  newDrill: string;
  playerId: string;
  shotType: ShotType | "";
  stickId: string;
  cameraView: CameraView;
  captureFps: string;
  captureFpsConfirmed: boolean;
  exposureUs: string;
  notes: string;
}
export type MetaErrors = Partial<Record<keyof MetaFormValues, string>>;

/** The viewer's own today (YYYY-MM-DD), not UTC's. */
export const today = todayIso;

export const emptyMeta = (): MetaFormValues => ({
  title: "", session: "new", newDate: today(), newVenue: "", newDrill: "", playerId: "", shotType: "", stickId: "",
  cameraView: "side", captureFps: "", captureFpsConfirmed: false, exposureUs: "", notes: "",
});

const num = (s: string) => (s.trim() === "" ? undefined : Number(s.replace(/[\s,]/g, "")));

function toInput(v: MetaFormValues) {
  return {
    title: v.title,
    ...(v.session === "new" ? { newSession: { date: v.newDate, venue: v.newVenue, drill: v.newDrill } } : v.session ? { sessionId: v.session } : {}),
    playerId: v.playerId,
    shotType: v.shotType || undefined,
    stickId: v.stickId || null,
    cameraView: v.cameraView,
    captureFps: num(v.captureFps),
    captureFpsConfirmed: v.captureFps.trim() !== "" && v.captureFpsConfirmed,
    exposureUs: v.exposureUs.trim() === "" ? null : num(v.exposureUs),
    notes: v.notes,
  };
}

/** A schema path (or a server error's path) to the form field that shows it. */
const fieldOf: Record<string, keyof MetaFormValues> = {
  sessionId: "session", "newSession.date": "newDate", "newSession.venue": "newVenue", "newSession.drill": "newDrill", newSession: "session",
};
export function errorsFrom(problems: FieldProblem[]): MetaErrors {
  const out: MetaErrors = {};
  for (const p of problems) {
    const field = fieldOf[p.path] ?? (p.path as keyof MetaFormValues);
    out[field] ??= p.message;
  }
  return out;
}

/**
 * The form checked against the shared schema. An image sequence (`sequence`) carries no rate of
 * its own: the typed capture rate is required, and typing it is the confirmation.
 */
export function validateMeta(v: MetaFormValues, o: { sequence?: boolean } = {}): { meta: ClipMeta; errors?: undefined } | { meta?: undefined; errors: MetaErrors } {
  const r = ClipMetaSchema.safeParse(toInput(o.sequence ? { ...v, captureFpsConfirmed: true } : v));
  const errors = r.success ? {} : errorsFrom(r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message })));
  if (o.sequence && v.captureFps.trim() === "") errors.captureFps ??= "Type the rate the camera recorded at: numbered frames carry no rate of their own.";
  if (r.success && !errors.captureFps) return { meta: r.data };
  return { errors };
}

/** Back from a remembered upload's details (to resume after a reload without retyping). */
export function fromMeta(m: ClipMeta): MetaFormValues {
  return {
    ...emptyMeta(),
    title: m.title, session: m.sessionId ?? "new", newDate: m.newSession?.date ?? today(), newVenue: m.newSession?.venue ?? "", newDrill: m.newSession?.drill ?? "",
    playerId: m.playerId, shotType: m.shotType, stickId: m.stickId ?? "", cameraView: m.cameraView,
    captureFps: m.captureFps === undefined ? "" : String(m.captureFps), captureFpsConfirmed: m.captureFpsConfirmed,
    exposureUs: m.exposureUs == null ? "" : String(m.exposureUs), notes: m.notes,
  };
}
