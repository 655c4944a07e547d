// The readout API (docs/api.md, "Shot readout, side by side, progress, sharing and exports"):
// queries, bodies and answers both sides share, and the one list of results with their units,
// digits and wording, so the page, the PDF, the CSV and the e-mail print the same numbers.
import { z } from "zod";
import { opaqueId } from "./text";
import type { ShotResults } from "./shot-results";
import type { DigitiseClip, ShotEventKey, ShotStickInfo } from "./shots";
import { display, type UnitSystem } from "../units";
import { frameClock, type FrameTimes } from "../frame-clock";

export const SHOT_TYPES = ["slap", "wrist", "snap", "backhand"] as const;
export type ShotType = (typeof SHOT_TYPES)[number];
export const shotTypeLabels: Record<ShotType, string> = { slap: "Slap shot", wrist: "Wrist shot", snap: "Snap shot", backhand: "Backhand" };

const id = (what: string) => opaqueId(what);
const uuid = (what: string) => z.uuid({ error: `${what} must be a shot id` });
const units = z.enum(["metric", "imperial"], { error: 'units must be "metric" or "imperial"' });

// ---- queries and bodies ------------------------------------------------------------------------

export const ShotListQuery = z.object({
  playerId: id("playerId").optional(),
  stickId: z.uuid({ error: "stickId must be a stick id" }).optional(),
  shotType: z.enum(SHOT_TYPES, { error: "shotType must be slap, wrist, snap or backhand" }).optional(),
  /** Staff's review queue: "waiting" = results in, not yet published; "published". */
  review: z.enum(["waiting", "published"], { error: "review must be waiting or published" }).optional(),
});
export type ShotListQuery = z.infer<typeof ShotListQuery>;

/** The shots list is paged: a team of a season holds tens of thousands of shots. */
export const SHOTS_PAGE_MAX = 200;
export const ShotListPageQuery = ShotListQuery.extend({
  page: z.coerce.number({ error: "page must be a number" }).int().min(1, { error: "page starts at 1" }).default(1),
  pageSize: z.coerce.number({ error: "pageSize must be a number" }).int().min(1).max(SHOTS_PAGE_MAX, { error: `pageSize is at most ${SHOTS_PAGE_MAX}` }).default(50),
});
export type ShotListPageQuery = ShotListQuery & { page?: number; pageSize?: number };

/** Progress shows one shot type at a time: none given = the player's most common, "all" = every type. */
export const ProgressQuery = ShotListQuery.extend({
  shotType: z.enum([...SHOT_TYPES, "all"], { error: "shotType must be slap, wrist, snap, backhand or all" }).optional(),
});
export type ProgressQuery = z.input<typeof ProgressQuery>;

export const CompareQuery = z
  .object({ a: uuid("a"), b: uuid("b") })
  .refine((q) => q.a !== q.b, { path: ["b"], error: "choose two different shots to compare" });
export type CompareQuery = z.infer<typeof CompareQuery>;

export const ExportQuery = z.object({ units: units.optional() });

export const ShareShotBody = z
  .strictObject({
    /** The shot's own player (sharing with them publishes the shot). */
    player: z.boolean({ error: "player must be true or false" }).default(true),
    /** Every coach, analyst and team admin of the team (but the one sharing). */
    staff: z.boolean({ error: "staff must be true or false" }).default(false),
    /** Players of the team other than the shot's own: they see it while it stays published. */
    teammates: z
      .array(z.string({ error: "each teammate is a member id" }).min(1, { error: "a teammate id is empty" }).max(100, { error: "a teammate id is longer than 100 characters" }), {
        error: "teammates must be a list of member ids",
      })
      .max(50, { error: "share with at most 50 teammates at a time" })
      .default([]),
  })
  .refine((b) => b.player || b.staff || b.teammates.length > 0, { path: ["player"], error: "choose whom to share with: the player, teammates, the team's staff, or a mix" });
export type ShareShotBody = z.input<typeof ShareShotBody>;

/** The team's review step: off (`autoPublish`), a shot reaches its player as soon as it has results. */
export const ReviewSettings = z.strictObject({ autoPublish: z.boolean({ error: "autoPublish must be true or false" }) });
export type ReviewSettings = z.infer<typeof ReviewSettings>;

/** Publishing a shot to its player; `notify` e-mails them (unless they turned shot e-mails off). */
export const PublishShotBody = z.strictObject({ notify: z.boolean({ error: "notify must be true or false" }).default(true) });
export type PublishShotBody = z.input<typeof PublishShotBody>;

// ---- answers -------------------------------------------------------------------------------------

export interface PersonRef {
  id: string;
  name: string;
}

export interface ShotListItem {
  id: string;
  label: string;
  clipId: string;
  clipTitle: string;
  playerId: string | null;
  playerName: string | null;
  stickId: string | null;
  stickLabel: string | null;
  shotType: ShotType;
  /** The session's date, else the day the clip was uploaded (YYYY-MM-DD). */
  date: string;
  sessionId: string | null;
  venue: string | null;
  captureFps: number;
  /** Results present; otherwise `missing` says what to do next. */
  hasResults: boolean;
  missing: string | null;
  puckExitSpeedMps: number | null;
  bladeSpeedMps: number | null;
  peakBendDeg: number | null;
  loadTimeMs: number | null;
  contactTimeMs: number | null;
  /** New results are being computed (the clip's calibration or the stick changed); the numbers are the previous ones. */
  recomputing: boolean;
  /** The viewer sees it because a coach shared it with them (not as its player or staff). */
  sharedWithMe: boolean;
  /** How many people it has been shared with (staff only; 0 for players). */
  shareCount: number;
  /** Published to its player; false while staff review it (players only ever see published shots). */
  published: boolean;
}

export interface ShotListResponse {
  /** One page, newest first, with the filters applied. */
  shots: ShotListItem[];
  total: number;
  page: number;
  pageSize: number;
  /** For the filters: the players and sticks among all the shots one may see (not just this page). */
  players: PersonRef[];
  sticks: { id: string; label: string }[];
}

export interface ReadoutEvent {
  key: ShotEventKey;
  frame: number;
  /** From the shot's first frame, by the capture rate. */
  tMs: number;
  /** From puck strike (negative before it); null without a puck strike. */
  tFromStrikeMs: number | null;
}

export interface ShareRow {
  userId: string;
  name: string;
  role: string;
  sharedAt: string;
  sharedByName: string | null;
}

export interface ShotReadout {
  shot: {
    id: string;
    label: string;
    clipId: string;
    playerId: string | null;
    playerName: string | null;
    stickId: string | null;
    stickLabel: string | null;
    shotType: ShotType;
    cameraView: string;
    date: string;
    venue: string | null;
    frameStart: number;
    frameEnd: number;
    version: number;
    updatedAt: string;
  };
  /** The clip as Digitise knows it; only the calibration's kind, not its points. */
  clip: Omit<DigitiseClip, "playerId" | "calibration"> & { calibration: "scaleBar" | "plane" | null };
  events: ReadoutEvent[];
  /** The clip's frame clock over the shot's frames in capture seconds; null when it is even (frame ÷ rate). */
  frameTimes: FrameTimes | null;
  results: ShotResults | null;
  /** When there are no results: what is still needed, said as the next step. */
  missing: string | null;
  /** The results were computed from an older version of the marks. */
  stale: boolean;
  /** New results are being computed (the clip's calibration or the stick changed); these are the previous ones. */
  recomputing: boolean;
  computedAt: string | null;
  stick: ShotStickInfo | null;
  /** Who it was shared with (staff see all; a player sees only their own share). */
  shares: ShareRow[];
  /** When staff published it to its player; null while it is in review (only staff see it then). */
  publication: { publishedAt: string; publishedByName: string | null } | null;
  can: { edit: boolean; share: boolean; publish: boolean };
}

export interface CompareResponse {
  a: ShotReadout;
  b: ShotReadout;
}

export interface ProgressPoint {
  shotId: string;
  label: string;
  date: string;
  sessionId: string | null;
  venue: string | null;
  stickId: string | null;
  stickLabel: string | null;
  shotType: ShotType;
  /** `apart`: the engine's note that questions this value; such a value is shown apart, never best or typical. */
  values: Partial<Record<MetricKey, { value: number; u: number | null; apart?: string }>>;
}

export interface MetricSummary {
  count: number;
  /** SI, as the metric's `best` direction says (highest or lowest). */
  best: number | null;
  bestShotId: string | null;
  /** Median: the typical value. */
  typical: number | null;
  /** Median of the first and of the last session with this result, when there are two sessions or more. */
  firstSession: number | null;
  lastSession: number | null;
  /** Values left out of all of the above because the engine questioned them (shown apart, with the note). */
  apart: number;
}

export interface ProgressResponse {
  player: PersonRef;
  /** Filters offered (from every shot of the player, before filtering). */
  sticks: { id: string; label: string }[];
  shotTypes: ShotType[];
  /** Shots with results per type, before filtering: the default type is the most common. */
  shotTypeCounts: Partial<Record<ShotType, number>>;
  /** The type shown; null = every type. */
  shotType: ShotType | null;
  points: ProgressPoint[];
  summary: Record<MetricKey, MetricSummary>;
  /** Shots of the player (after filters) still without results. */
  withoutResults: number;
}

export interface PlayersResponse {
  players: (PersonRef & { shots: number })[];
}

export interface ShareResponse {
  recipients: { userId: string; name: string; role: string; added: boolean; mailed: boolean; note: string | null }[];
  /** This share published the shot (sharing with a player makes it visible to its player too). */
  published: boolean;
}

export interface PublishResponse {
  publication: { publishedAt: string; publishedByName: string | null } | null;
  /** Whether the player was e-mailed, and why not when they were not. */
  mailed: boolean;
  note: string | null;
}

// ---- results, their units and wording ----------------------------------------------------------

export const METRIC_KEYS = ["puckExitSpeed", "bladeSpeedAtStrike", "peakBend", "loadTime", "contactTime", "storedEnergy"] as const;
export type MetricKey = (typeof METRIC_KEYS)[number];

type Kind = "speed" | "angle" | "time" | "energy" | "length";

export interface MetricDef {
  key: MetricKey;
  label: string;
  kind: Kind;
  /** What "best" means for this result, and its name in a sentence. */
  best: "max" | "min";
  bestLabel: string;
  /** Short explanation on the card. */
  hint: string;
  /** The engine's note (shared/mechanics/plausibility.ts) that sets this value apart from best and typical. */
  implausible?: string;
  /** SI value and standard uncertainty from the engine's results, or null. */
  read: (r: ShotResults) => { value: number; u: number | null } | null;
}

export const METRICS: readonly MetricDef[] = [
  {
    key: "puckExitSpeed", label: "Puck exit speed", kind: "speed", best: "max", bestLabel: "Fastest", implausible: "PUCK_SPEED_IMPLAUSIBLE",
    hint: "Straight-line fit to the puck's flight after release.",
    read: (r) => ({ value: r.puckExitSpeed.valueMps, u: r.puckExitSpeed.uncertaintyMps }),
  },
  {
    key: "bladeSpeedAtStrike", label: "Blade speed at strike", kind: "speed", best: "max", bestLabel: "Fastest", implausible: "BLADE_SPEED_IMPLAUSIBLE",
    hint: "Speed of the blade as it reaches the puck.",
    read: (r) => (r.bladeSpeedAtStrike ? { value: r.bladeSpeedAtStrike.valueMps, u: r.bladeSpeedAtStrike.uncertaintyMps } : null),
  },
  {
    key: "peakBend", label: "Peak bend", kind: "angle", best: "max", bestLabel: "Most bend",
    hint: "Largest bend angle of the shaft (0° when straight).",
    read: (r) => (r.peakBend ? { value: r.peakBend.angleDeg, u: r.peakBend.uncertaintyDeg } : null),
  },
  {
    key: "loadTime", label: "Load time", kind: "time", best: "max", bestLabel: "Longest load",
    hint: "Ice strike → puck strike: how long the stick was loaded against the ice.",
    // Results from engines before mechanics-1.2.0 carry no time uncertainty: one frame then.
    read: (r) => (r.loadTimeMs === null ? null : { value: r.loadTimeMs, u: r.loadTimeUncertaintyMs ?? r.frameTimeMs }),
  },
  {
    key: "contactTime", label: "Contact time", kind: "time", best: "min", bestLabel: "Quickest release", implausible: "CONTACT_TIME_OUTSIDE_RANGE",
    hint: "Puck strike → release: how long the puck stayed on the blade.",
    read: (r) => ({ value: r.contactTimeMs, u: r.contactTimeUncertaintyMs ?? r.frameTimeMs }),
  },
  {
    key: "storedEnergy", label: "Stored energy", kind: "energy", best: "max", bestLabel: "Most energy",
    hint: "Energy in the bent shaft at peak bend, from the stick's stiffness.",
    read: (r) => (r.storedEnergy ? { value: r.storedEnergy.valueJ, u: r.storedEnergy.uncertaintyJ } : null),
  },
];

export const metricDef = (k: MetricKey): MetricDef => METRICS.find((m) => m.key === k)!;

const DIGITS: Record<Kind, Record<UnitSystem, number>> = {
  speed: { metric: 1, imperial: 1 },
  angle: { metric: 1, imperial: 1 },
  time: { metric: 1, imperial: 1 },
  energy: { metric: 1, imperial: 1 },
  length: { metric: 1, imperial: 2 },
};

/** Unit label of a kind of result in a unit system. */
export function unitOf(kind: Kind, system: UnitSystem): string {
  if (kind === "angle") return "°";
  if (kind === "time") return "ms";
  return display[kind][system].unit;
}

/** SI → the number shown (times stay ms, angles degrees). Linear, so it also converts uncertainties. */
export function convert(kind: Kind, si: number, system: UnitSystem): number {
  if (kind === "angle" || kind === "time") return si;
  return display[kind][system].from(si);
}

export const digitsOf = (kind: Kind, system: UnitSystem) => DIGITS[kind][system];

/** "108.4" — the number alone, as printed everywhere (point as decimal mark, no grouping). */
export function formatNumber(kind: Kind, si: number, system: UnitSystem): string {
  return convert(kind, si, system).toFixed(digitsOf(kind, system));
}

const withUnit = (text: string, unit: string) => (unit === "°" ? `${text}°` : `${text} ${unit}`);

/** "108.4 km/h", "7.0°", "25.0 ms". */
export function formatValue(kind: Kind, si: number | null | undefined, system: UnitSystem): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  return withUnit(formatNumber(kind, si, system), unitOf(kind, system));
}

/** "108.4 ± 1.3 km/h"; without an uncertainty just the value. */
export function formatWithU(kind: Kind, si: number | null | undefined, u: number | null | undefined, system: UnitSystem): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  if (u === null || u === undefined || !Number.isFinite(u)) return formatValue(kind, si, system);
  const d = digitsOf(kind, system);
  const text = `${convert(kind, si, system).toFixed(d)} ± ${Math.abs(convert(kind, u, system)).toFixed(d)}`;
  return unitOf(kind, system) === "°" ? `${text}°` : `${text} ${unitOf(kind, system)}`;
}

/** A metric of a result set, formatted: value, "± u" and unit separately for cards and tables. */
export function metricText(def: MetricDef, r: ShotResults | null, system: UnitSystem) {
  const v = r ? def.read(r) : null;
  if (!v) return null;
  const d = digitsOf(def.kind, system);
  return {
    value: formatNumber(def.kind, v.value, system),
    u: v.u === null ? null : Math.abs(convert(def.kind, v.u, system)).toFixed(d),
    unit: unitOf(def.kind, system),
    full: formatWithU(def.kind, v.value, v.u, system),
  };
}

/**
 * How the times' uncertainty arises, one wording for the readout, the PDF and the CSV: "each event
 * marked to ±1 frame (1.00 ms)". Results from engines before mechanics-1.2.0 say one frame.
 */
export function eventTimingText(r: Pick<ShotResults, "frameTimeMs" | "uncertainty">): string {
  const e = r.uncertainty.eventErrorFrames;
  if (e === undefined) return `good to one frame (${r.frameTimeMs.toFixed(2)} ms)`;
  return `from events each marked to ±${e} frame${e === 1 ? "" : "s"} (${(e * r.frameTimeMs).toFixed(2)} ms)`;
}

/** Which result a plausibility note (by its engine code) belongs to; null = the whole shot. */
export function noteMetric(code: string): MetricKey | null {
  if (code.startsWith("PUCK_")) return "puckExitSpeed";
  if (code.startsWith("BLADE_")) return "bladeSpeedAtStrike";
  if (code.startsWith("CONTACT_")) return "contactTime";
  if (code.startsWith("LOAD_")) return "loadTime";
  if (code.startsWith("BEND_")) return "peakBend";
  if (code.startsWith("ENERGY_") || code.startsWith("STORED_")) return "storedEnergy";
  return null;
}

/** Time of a frame by the capture rate, from `fromFrame`, in ms. */
export const frameTimeMs = (frame: number, fromFrame: number, captureFps: number) => ((frame - fromFrame) / captureFps) * 1000;

/**
 * Milliseconds between two frames on the clip's own frame clock (shotFrameTimes: capture times of
 * the shot's frames; shared/frame-clock.ts), else frame ÷ capture rate. Across a dropped stretch
 * the index would put a frame too early by the missing time.
 */
export function frameClockMs(times: FrameTimes | null | undefined, captureFps: number) {
  return frameClock(times, captureFps).ms;
}

/** Links into the app, the same in e-mails, PDFs and pages. */
export const readoutPath = (shotId: string, teamId?: string) => `/readout/${shotId}${teamId ? `?team=${encodeURIComponent(teamId)}` : ""}`;

/** A shot's name for headings, lists and e-mails: its label, else what and when. */
export function shotTitle(s: { label: string; shotType: ShotType; date: string; playerName?: string | null }): string {
  if (s.label.trim()) return s.label.trim();
  return [shotTypeLabels[s.shotType] ?? "Shot", s.playerName, s.date].filter(Boolean).join(" · ");
}
