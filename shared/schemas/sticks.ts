// The Stick lab HTTP API: request bodies (zod, checked by the server and the page alike) and
// the shapes the server answers with. SI inside: lengths mm, forces N, EI N·m²; flex is lbf per
// inch at mid-span of the reference span (the rating's own test). Bench-test and beam inputs are
// the engine's own schemas (./stick-lab), so every entry point refuses the same things.
import { z } from "zod";
import { humanText, opaqueId, TEXT_LIMITS } from "./text";
import type { BenchFit } from "../mechanics/bench-fit";
import type { BeamResult } from "../mechanics/beam";
import type { ShotBeam } from "../mechanics/beam-from-shot";
import type { BenchReading } from "../mechanics/readings-csv";

export { beamInputSchema, benchTestInputSchema, type BenchTestInput, type BeamInputJson } from "./stick-lab";

/** Ratings run 35–110 in practice [CP]; the bounds only catch typing slips. */
export const FLEX_LIMITS = { min: 10, max: 200 } as const;
/** IIHF: shaft ≤ 163.0 cm [P]; the bound leaves room for goalie and odd sticks. */
export const STICK_LENGTH_LIMIT_MM = 2000;
export const DEFAULT_FLEX_ALERT_PERCENT = 85;

const text = (max: number, field: string, multiline = false) => humanText({ field, max, multiline });

/** The fields of a stick; PATCH sends any of them, POST needs at least a label. */
const stickFields = {
  label: humanText({ field: "The label", max: TEXT_LIMITS.label, min: 1, minMessage: "Give the stick a label" }),
  /** A player of the team; null = a team stick with no owner. */
  ownerId: opaqueId("ownerId").nullable(),
  ratedFlex: z
    .number({ error: "Rated flex must be a number" })
    .min(FLEX_LIMITS.min, `Rated flex is at least ${FLEX_LIMITS.min}`)
    .max(FLEX_LIMITS.max, `Rated flex is at most ${FLEX_LIMITS.max}`)
    .nullable(),
  lengthMm: z
    .number({ error: "Length must be a number" })
    .positive("Length must be greater than zero")
    .max(STICK_LENGTH_LIMIT_MM, `Length is at most ${STICK_LENGTH_LIMIT_MM} mm`)
    .nullable(),
  bladeCurve: text(TEXT_LIMITS.label, "The blade curve"),
  lie: text(TEXT_LIMITS.short, "The lie"),
  firstUseDate: z.iso.date("Enter a date as YYYY-MM-DD").nullable(),
  notes: text(TEXT_LIMITS.notes, "Notes", true),
};

export const StickCreateSchema = z.strictObject({
  label: stickFields.label,
  ownerId: stickFields.ownerId.default(null),
  ratedFlex: stickFields.ratedFlex.default(null),
  lengthMm: stickFields.lengthMm.default(null),
  bladeCurve: stickFields.bladeCurve.default(""),
  lie: stickFields.lie.default(""),
  firstUseDate: stickFields.firstUseDate.default(null),
  notes: stickFields.notes.default(""),
});
export type StickCreate = z.input<typeof StickCreateSchema>;

export const StickPatchSchema = z
  .strictObject(stickFields)
  .partial()
  .refine((p) => Object.keys(p).length > 0, "Send at least one field to change");
export type StickPatch = z.infer<typeof StickPatchSchema>;

/** The fields that come with a CSV upload (multipart text fields arrive as strings). */
export const BenchCsvFieldsSchema = z.strictObject({
  date: z.iso.date("Enter the test date as YYYY-MM-DD"),
  spanMm: z.coerce.number({ error: "spanMm must be a number" }).positive("spanMm must be greater than zero").optional(),
  loadPointMm: z.coerce.number({ error: "loadPointMm must be a number" }).positive("loadPointMm must be greater than zero").optional(),
});

export const StickSettingsSchema = z.strictObject({
  flexAlertPercent: z
    .number({ error: "The alert level must be a number" })
    .int("Use a whole percentage")
    .min(50, "The alert level is at least 50 %")
    .max(100, "The alert level is at most 100 %"),
});
export type StickSettings = z.infer<typeof StickSettingsSchema>;

export interface PersonRef {
  id: string;
  name: string;
}

export interface LatestBenchTest {
  benchTestId: string;
  testedOn: string;
  measuredFlex: number;
  /** Against the stick's current rating; null without one. */
  percentOfRated: number | null;
  eiNm2: number;
}

export interface StickRow {
  id: string;
  label: string;
  owner: PersonRef | null;
  ratedFlex: number | null;
  lengthMm: number | null;
  bladeCurve: string;
  lie: string;
  firstUseDate: string | null;
  notes: string;
  createdAt: string;
  latest: LatestBenchTest | null;
  benchTestCount: number;
  shotCount: number;
  /** The latest bench test measures below the team's alert share of the rating. */
  belowAlert: boolean;
}

export interface SticksResponse {
  sticks: StickRow[];
  flexAlertPercent: number;
  /** The team's players, for the owner picker; empty for players. */
  players: PersonRef[];
  canEdit: boolean;
  canManageSettings: boolean;
}

/** How the readings were entered, so the page can show them as typed. */
export interface BenchEntry {
  source: "table" | "csv";
  loadUnit: "lbf" | "N";
  deflectionUnit: "in" | "mm";
  fileName?: string;
}

export interface BenchTestRow {
  id: string;
  stickId: string;
  testedOn: string;
  spanMm: number;
  loadPointMm: number;
  /** In SI: N and mm. */
  readings: BenchReading[];
  /** The engine's fit; ratedFlex and percentOfRated follow the stick's current rating. */
  fit: BenchFit;
  entry: BenchEntry;
  createdBy: PersonRef | null;
  createdAt: string;
}

export interface ShotRef {
  id: string;
  label: string;
  date: string;
  player: PersonRef | null;
  /** The shot's stored results hold a shaft deflection: it can start a beam model. */
  hasDeflection: boolean;
}

export interface StickDetail {
  stick: StickRow;
  /** Oldest first. */
  benchTests: BenchTestRow[];
  /** Shots taken with the stick, counted per day (the session's date, else the day it was created). */
  shotsByDate: { date: string; count: number }[];
  /** The most recent shots with this stick that the viewer may see (up to 50). */
  shots: ShotRef[];
  flexAlertPercent: number;
  canEdit: boolean;
}

/** The stiffness a beam or a shot uses, and where it came from. */
export interface StickStiffness {
  eiNm2: number;
  source: "bench" | "rated";
  measuredFlex: number | null;
  testedOn: string | null;
}

export interface BeamSolveResponse {
  result: BeamResult;
}

export interface ShotBeamResponse {
  shot: { id: string; label: string; date: string; stickId: string; stickLabel: string; frame: number };
  stiffness: StickStiffness;
  beam: ShotBeam;
  result: BeamResult;
}
