// Loadframe's tables. The better-auth tables (user, session, account, verification,
// organization = team, member, invitation) are generated into auth-schema.ts; ours follow.
// Every domain row carries its team id so that a single `where team_id = $active` keeps teams apart.
import { sql } from "drizzle-orm";
import { bigint, boolean, date, doublePrecision, index, integer, json, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { organization, user } from "./auth-schema";
import type { ClipTiming } from "../../shared/schemas/clips";
import { PLAN_IDS } from "../../shared/billing/plans";

export * from "./auth-schema";

const teamRef = () => text("team_id").notNull().references(() => organization.id, { onDelete: "cascade" });
const createdAt = () => timestamp("created_at", { withTimezone: true }).defaultNow().notNull();

export const teamSettings = pgTable("team_settings", {
  teamId: text("team_id").primaryKey().references(() => organization.id, { onDelete: "cascade" }),
  /** Warn when a stick measures below this share of its rated flex. */
  flexAlertPercent: integer("flex_alert_percent").notNull().default(85),
  /** Publish a shot to its player by itself as soon as it has results (no review step). */
  autoPublish: boolean("auto_publish").notNull().default(false),
});

export const userPrefs = pgTable("user_prefs", {
  userId: text("user_id").primaryKey().references(() => user.id, { onDelete: "cascade" }),
  units: text("units", { enum: ["metric", "imperial"] }).notNull().default("metric"),
  notifyClipReady: boolean("notify_clip_ready").notNull().default(true),
  notifyShotShared: boolean("notify_shot_shared").notNull().default(true),
});

/** A training or testing date at a venue ("Session" in the vocabulary). */
export const trainingSession = pgTable(
  "training_session",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    date: date("date").notNull(),
    venue: text("venue").notNull().default(""),
    drill: text("drill").notNull().default(""),
    createdAt: createdAt(),
  },
  (t) => [index("training_session_team_idx").on(t.teamId, t.date)],
);

export const stick = pgTable(
  "stick",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    ownerId: text("owner_id").references(() => user.id, { onDelete: "set null" }),
    label: text("label").notNull(),
    ratedFlex: doublePrecision("rated_flex"),
    lengthMm: doublePrecision("length_mm"),
    bladeCurve: text("blade_curve").notNull().default(""),
    lie: text("lie").notNull().default(""),
    firstUseDate: date("first_use_date"),
    notes: text("notes").notNull().default(""),
    createdAt: createdAt(),
  },
  (t) => [index("stick_team_idx").on(t.teamId)],
);

export const benchTest = pgTable(
  "bench_test",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    stickId: uuid("stick_id").notNull().references(() => stick.id, { onDelete: "cascade" }),
    testedOn: date("tested_on").notNull(),
    spanMm: doublePrecision("span_mm").notNull(),
    loadPointMm: doublePrecision("load_point_mm").notNull(),
    /** Readings in SI: [{ loadN, deflectionMm }]. */
    readings: jsonb("readings").notNull(),
    /** The fit as computed by shared/mechanics (stiffness, r2, flags …). */
    fit: jsonb("fit").notNull(),
    measuredFlex: doublePrecision("measured_flex").notNull(),
    eiNm2: doublePrecision("ei_nm2").notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("bench_test_stick_idx").on(t.stickId, t.testedOn)],
);

export const clipStatus = ["uploading", "probing", "extracting", "ready", "failed"] as const;
export type ClipStatus = (typeof clipStatus)[number];

export const clip = pgTable(
  "clip",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    sessionId: uuid("session_id").references(() => trainingSession.id, { onDelete: "set null" }),
    playerId: text("player_id").references(() => user.id, { onDelete: "set null" }),
    stickId: uuid("stick_id").references(() => stick.id, { onDelete: "set null" }),
    uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
    title: text("title").notNull().default(""),
    shotType: text("shot_type", { enum: ["slap", "wrist", "snap", "backhand"] }).notNull().default("slap"),
    cameraView: text("camera_view", { enum: ["side", "front", "overhead", "other"] }).notNull().default("side"),
    /** The rate the camera captured at; every speed uses this, never the stored rate. */
    captureFps: doublePrecision("capture_fps").notNull(),
    captureFpsConfirmed: boolean("capture_fps_confirmed").notNull().default(false),
    storedFps: doublePrecision("stored_fps"),
    exposureUs: doublePrecision("exposure_us"),
    notes: text("notes").notNull().default(""),
    status: text("status", { enum: clipStatus }).notNull().default("uploading"),
    failureReason: text("failure_reason"),
    framesDone: integer("frames_done").notNull().default(0),
    frameCount: integer("frame_count"),
    width: integer("width"),
    height: integer("height"),
    durationS: doublePrecision("duration_s"),
    rotationDeg: integer("rotation_deg").notNull().default(0),
    variableFrameRate: boolean("variable_frame_rate").notNull().default(false),
    codec: text("codec"),
    probe: jsonb("probe"),
    /** Real presentation time of each frame in seconds, index 0 = frame 1. */
    frameTimes: jsonb("frame_times").$type<number[]>(),
    /** The frame clock ingest found: even, snapped or uneven; gaps, repeats, missing frames. */
    timing: jsonb("timing").$type<ClipTiming>(),
    frameFormat: text("frame_format").notNull().default("jpg"),
    sha256: text("sha256"),
    sizeBytes: bigint("size_bytes", { mode: "number" }),
    originalName: text("original_name").notNull().default(""),
    /** Calibration for every shot in this clip (scale bar or plane), validated by shared/mechanics. */
    calibration: jsonb("calibration"),
    createdAt: createdAt(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [
    index("clip_team_created_idx").on(t.teamId, t.createdAt),
    // The clips table opens newest first (created_at desc, then id): this order, read straight
    // from the index, spares sorting every clip of the team (scripts/bench/load.ts).
    index("clip_team_newest_idx").on(t.teamId, t.createdAt.desc().nullsFirst(), t.id),
    index("clip_team_player_idx").on(t.teamId, t.playerId),
    // A session's clips, when its date changes (its shots' stored dates follow, decision 173).
    index("clip_session_idx").on(t.sessionId),
    uniqueIndex("clip_team_sha_idx").on(t.teamId, t.sha256).where(sql`${t.sha256} is not null`),
  ],
);

export const shot = pgTable(
  "shot",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    clipId: uuid("clip_id").notNull().references(() => clip.id, { onDelete: "cascade" }),
    playerId: text("player_id").references(() => user.id, { onDelete: "set null" }),
    stickId: uuid("stick_id").references(() => stick.id, { onDelete: "set null" }),
    label: text("label").notNull().default(""),
    frameStart: integer("frame_start").notNull().default(1),
    frameEnd: integer("frame_end"),
    /** { puck: [[frame, x, y], …], bladeHeel: …, … } in original frame pixels. */
    marks: jsonb("marks").notNull().default({}),
    /** { iceStrike?, puckStrike?, peakBend?, release? } as frame numbers. */
    events: jsonb("events").notNull().default({}),
    /** Optimistic concurrency: every save names the version it started from. */
    version: integer("version").notNull().default(1),
    /** Set when staff publish the shot to its player (and teammates it is shared with); null while in review. */
    publishedAt: timestamp("published_at", { withTimezone: true }),
    /** Who published it; null when the team's auto-publish did, or the person is gone. */
    publishedBy: text("published_by").references(() => user.id, { onDelete: "set null" }),
    updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).defaultNow().notNull(),
    /**
     * The shot's date by THE rule (server/entities/shot/date.ts), stored so that lists are read in
     * index order. PostgreSQL keeps it (triggers of migration 0010, docs/decisions/173-stored-shot-date.md)
     * whenever the shot's clip, the clip's session or the session's date changes; the application
     * never writes it (the default is overwritten on insert).
     */
    shotDate: date("shot_date", { mode: "string" }).notNull().default(sql`current_date`),
    /** When the shot's clip was uploaded, kept with the date: the list order's next key. */
    clipCreatedAt: timestamp("clip_created_at", { withTimezone: true }).notNull().defaultNow(),
    /**
     * The clip's shot type, stored beside the date so the Shots list's type filter reads one
     * index instead of joining every shot to its clip. PostgreSQL keeps it (the triggers of migration shot_type_on_shot,
     * docs/decisions/176-stored-shot-type.md); the application never writes it.
     */
    shotType: text("shot_type", { enum: ["slap", "wrist", "snap", "backhand"] }).notNull().default("slap"),
  },
  (t) => [
    // "Newest first" (entities/shot/date.ts) exactly, for the team and for one player; player_id
    // last so a player's own-or-shared page is found in the index alone.
    // (DESC NULLS FIRST is what ORDER BY … DESC means; the index must say the same to be used.)
    index("shot_team_newest_idx").on(t.teamId, t.shotDate.desc().nullsFirst(), t.clipCreatedAt.desc().nullsFirst(), t.createdAt.desc().nullsFirst(), t.id, t.playerId),
    index("shot_team_player_idx").on(t.teamId, t.playerId, t.shotDate.desc().nullsFirst(), t.clipCreatedAt.desc().nullsFirst(), t.createdAt.desc().nullsFirst(), t.id),
    // The list filtered by shot type, in the same order (its count reads the index alone).
    index("shot_team_type_idx").on(t.teamId, t.shotType, t.shotDate.desc().nullsFirst(), t.clipCreatedAt.desc().nullsFirst(), t.createdAt.desc().nullsFirst(), t.id, t.playerId),
    index("shot_team_stick_idx").on(t.teamId, t.stickId),
    index("shot_clip_idx").on(t.clipId),
    // Shots waiting for review (unpublished), in the list's order: the "waiting" filter's page and
    // count read only the review queue, not every shot of the team (decision 190).
    index("shot_team_unpublished_idx")
      .on(t.teamId, t.shotDate.desc().nullsFirst(), t.clipCreatedAt.desc().nullsFirst(), t.createdAt.desc().nullsFirst(), t.id)
      .where(sql`published_at is null`),
  ],
);

/**
 * How many shots a team has for each combination of what the Shots list filters by (player,
 * stick, shot type, published), so that staff's list total is a sum over a few rows instead of
 * a count of every shot of the team (docs/decisions/190-shot-tally.md). PostgreSQL keeps it:
 * statement triggers on `shot` (migration shot_tally) add each statement's net change inside the
 * writing transaction, so a committed tally always equals a count of the committed shots. The
 * application never writes it. No foreign keys: a team's or player's rows fall to zero as their
 * shots go, and zero rows count nothing.
 */
export const shotTally = pgTable(
  "shot_tally",
  {
    teamId: text("team_id").notNull(),
    playerId: text("player_id"),
    stickId: uuid("stick_id"),
    shotType: text("shot_type").notNull(),
    published: boolean("published").notNull(),
    n: integer("n").notNull(),
  },
  (t) => [unique("shot_tally_key").on(t.teamId, t.playerId, t.stickId, t.shotType, t.published).nullsNotDistinct()],
);

/**
 * What changed, for the answer caches of the hot reads (docs/decisions/192-answer-cache-with-a-change-stamp.md):
 * one row per team and writing transaction, added by statement triggers on every table those reads
 * read (migration answer_stamp), inside the writing transaction. A team's change stamp is its
 * `answer_stamp.n` plus its rows here (and the same for "*", changes of a person's name, which any
 * team may show): a committed write always raises it, and writers never wait for each other on it
 * (each adds its own row). Rows are folded into `answer_stamp` now and then. The application never
 * writes either table.
 */
export const answerChange = pgTable(
  "answer_change",
  {
    teamId: text("team_id").notNull(),
    xid: bigint("xid", { mode: "number" }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.teamId, t.xid] })],
);
export const answerStamp = pgTable("answer_stamp", {
  teamId: text("team_id").primaryKey(),
  n: bigint("n", { mode: "number" }).notNull(),
});

export const shotResult = pgTable("shot_result", {
  shotId: uuid("shot_id").primaryKey().references(() => shot.id, { onDelete: "cascade" }),
  teamId: teamRef(),
  engineVersion: text("engine_version").notNull(),
  /**
   * Null with `error` set when the marks are not yet enough to compute. Kept as the JSON text the
   * engine's answer was written as (json, not jsonb): one shot's readout sends this text as it is,
   * and PostgreSQL turning ~80 kB of jsonb back into text was most of a first read's database time
   * (docs/decisions/201-results-stored-as-json-text.md).
   */
  results: json("results"),
  /**
   * The results without their time series, kept by PostgreSQL itself: lists and trends read this
   * (a few hundred bytes) instead of decompressing every stored result (docs/decisions/107-results-summary-column.md).
   */
  summary: jsonb("summary").generatedAlwaysAs(sql`case when json_typeof(results) = 'object' then results::jsonb - 'series' end`),
  /**
   * The MD5 of the results' text as PostgreSQL sends it, kept beside them: one shot's readout keys
   * its shape check and ETag by it instead of hashing ~80 kB in the web process on every first read
   * (docs/decisions/199-first-read-bytes-and-one-query-watchdog.md).
   */
  resultsMd5: text("results_md5").generatedAlwaysAs(sql`md5(results::text)`),
  error: text("error"),
  shotVersion: integer("shot_version").notNull(),
  computedAt: timestamp("computed_at", { withTimezone: true }).defaultNow().notNull(),
  /**
   * Set when something the results depend on outside the shot changed (the clip's calibration, the
   * stick's stiffness) and a recompute job is queued; cleared by the run that read the new inputs.
   * While set, the stored results are the previous ones and every page says "recomputing".
   */
  recomputeRequestedAt: timestamp("recompute_requested_at", { withTimezone: true }),
});

export const shotShare = pgTable(
  "shot_share",
  {
    shotId: uuid("shot_id").notNull().references(() => shot.id, { onDelete: "cascade" }),
    userId: text("user_id").notNull().references(() => user.id, { onDelete: "cascade" }),
    teamId: teamRef(),
    sharedBy: text("shared_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.shotId, t.userId] }), index("shot_share_user_idx").on(t.userId)],
);

export const auditLog = pgTable(
  "audit_log",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    actorId: text("actor_id").references(() => user.id, { onDelete: "set null" }),
    action: text("action").notNull(),
    targetType: text("target_type").notNull(),
    targetId: text("target_id"),
    detail: jsonb("detail").notNull().default({}),
    createdAt: createdAt(),
  },
  (t) => [index("audit_team_idx").on(t.teamId, t.createdAt)],
);


/**
 * The paying unit: a club owns one or more teams and is on one plan. Its plan and subscription
 * state change only from the payment service's webhooks (server/billing/sync.ts).
 */
export const club = pgTable("club", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull(),
  plan: text("plan", { enum: PLAN_IDS }).notNull().default("pond"),
  /** The payment service's customer, made at the club's first checkout. */
  customerId: text("customer_id").unique(),
  subscriptionId: text("subscription_id"),
  /** As the payment service says: active, past_due, unpaid, canceled … */
  subscriptionStatus: text("subscription_status"),
  currentPeriodEnd: timestamp("current_period_end", { withTimezone: true }),
  cancelAtPeriodEnd: boolean("cancel_at_period_end").notNull().default(false),
  /** When a renewal first failed; the grace period runs from here. Cleared once paid. */
  pastDueSince: timestamp("past_due_since", { withTimezone: true }),
  syncedAt: timestamp("synced_at", { withTimezone: true }),
  createdAt: createdAt(),
});

export const clubTeam = pgTable(
  "club_team",
  {
    teamId: text("team_id").primaryKey().references(() => organization.id, { onDelete: "cascade" }),
    clubId: uuid("club_id").notNull().references(() => club.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [index("club_team_club_idx").on(t.clubId)],
);

/** Every webhook event applied, by the service's event id: a second delivery is not applied again. */
export const billingEvent = pgTable("billing_event", {
  id: text("id").primaryKey(),
  type: text("type").notNull(),
  clubId: uuid("club_id").references(() => club.id, { onDelete: "set null" }),
  /** The event's own creation time at the payment service. */
  createdAtService: timestamp("created_at_service", { withTimezone: true }).notNull(),
  receivedAt: timestamp("received_at", { withTimezone: true }).defaultNow().notNull(),
});

/** A pending club sign-up: the e-mail must be proven (a link with this token) before anything else. */
export const signupRequest = pgTable(
  "signup_request",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    email: text("email").notNull(),
    /** SHA-256 of the token in the link; the token itself is only in the mail. */
    tokenHash: text("token_hash").notNull().unique(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    usedAt: timestamp("used_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index("signup_request_email_idx").on(t.email)],
);

export const trackingStatus = ["queued", "running", "done", "failed", "cancelled"] as const;
export type TrackingStatus = (typeof trackingStatus)[number];

/**
 * One auto-digitise run of a shot: the seeds it started from, its progress while it runs, and what
 * it proposed once done (tracks, events, a scale bar) — kept apart from the shot's marks, which
 * only the analyst's accepting changes. Written whole at the end: a run is either done with all
 * its proposals or has none. At most one queued or running run per shot.
 */
export const trackingRun = pgTable(
  "tracking_run",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    teamId: teamRef(),
    shotId: uuid("shot_id").notNull().references(() => shot.id, { onDelete: "cascade" }),
    status: text("status", { enum: trackingStatus }).notNull().default("queued"),
    seedFrame: integer("seed_frame").notNull(),
    /** { landmark: [x, y] } on seedFrame, frame pixels. */
    seeds: jsonb("seeds").notNull(),
    frameStart: integer("frame_start").notNull(),
    frameEnd: integer("frame_end").notNull(),
    /** "decoding" | "tracking" | "events" while running. */
    phase: text("phase"),
    done: integer("done").notNull().default(0),
    total: integer("total").notNull().default(0),
    /** The pg-boss job working on it (a retry keeps the id; a takeover changes it). */
    jobId: text("job_id"),
    attempts: integer("attempts").notNull().default(0),
    proposals: jsonb("proposals"),
    failureReason: text("failure_reason"),
    requestedBy: text("requested_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    startedAt: timestamp("started_at", { withTimezone: true }),
    finishedAt: timestamp("finished_at", { withTimezone: true }),
    /** Moves with every progress write: a running row that stops moving has lost its worker. */
    updatedAt: timestamp("updated_at", { withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [
    index("tracking_run_shot_idx").on(t.shotId, t.createdAt),
    // Two analysts pressing at once: the second insert meets this index and gets the first run.
    uniqueIndex("tracking_run_live_idx").on(t.shotId).where(sql`${t.status} in ('queued', 'running')`),
  ],
);

/**
 * Hit counters of the per-address limits (server/security/rate-limit-store.ts), one fixed window
 * per key: kept here rather than in each process, so several web processes count together.
 */
export const rateLimitHit = pgTable(
  "rate_limit_hit",
  {
    key: text("key").primaryKey(),
    hits: integer("hits").notNull(),
    resetAt: timestamp("reset_at", { withTimezone: true }).notNull(),
  },
  (t) => [index("rate_limit_hit_reset_idx").on(t.resetAt)],
);
