// "What needs me now?" by role. Staff get the work waiting for them, a team admin also the
// roster's, a player their own latest results, bests and what teammates shared — and nothing a
// player cannot do. Every item carries its links; the page only lays them out.
import { isStaff, policy, type Actor } from "../auth/policy";
import type { HomeResponse, HomeShot, HomeTask } from "../../shared/schemas/home";
import { shotTypes, type ShotType } from "../../shared/schemas/clips";
import type { ShotResults } from "../../shared/schemas/shot-results";
import { metricDef } from "../../shared/schemas/readout";
import { shotDate } from "../entities/shot/date";
import * as readoutRepo from "../entities/shot/readout";
import { pendingInvitationsOf } from "../entities/member/membership";
import { listSticks } from "../sticks/service";
import { staffSeatUse } from "../billing/limits";
import { clipsWaiting } from "../entities/clip/repository";
import { liveTrackingRuns } from "../entities/tracking-run/repository";

const SHARED_WITHIN_DAYS = 14;
/** Each task shows its count and at most this many examples, so the page costs a handful of index reads. */
const EXAMPLES = 3;
const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString("en")} ${n === 1 ? one : many}`;
const clipName = (c: { title: string | null; originalName: string | null }) => c.title || c.originalName || "Untitled clip";
const shotName = (s: { label: string | null }) => s.label || "Unlabelled shot";

type Summary = Omit<ShotResults, "series"> | null;
/** A result the engine flagged as faster than any recorded shot is no personal best (shown on its readout with the note). */
const PUCK_APART = metricDef("puckExitSpeed").implausible;
const implausible = (s: Summary) => !!s?.notes.some((n) => n.code === PUCK_APART);

function homeShot(r: { id: string; label: string | null; date: string; shotType: string; summary: Summary }): HomeShot {
  return {
    id: r.id, label: shotName(r), date: r.date, shotType: r.shotType as ShotType,
    puckExitSpeedMps: r.summary?.puckExitSpeed.valueMps ?? null, puckExitSpeedUMps: r.summary?.puckExitSpeed.uncertaintyMps ?? null,
  };
}

async function staffTasks(a: Actor): Promise<HomeTask[]> {
  const [unconfirmed, failed, notDigitised, review, sticks, runs] = await Promise.all([
    clipsWaiting(a.teamId, "rateUnconfirmed", EXAMPLES),
    clipsWaiting(a.teamId, "failed", EXAMPLES),
    clipsWaiting(a.teamId, "notDigitised", EXAMPLES),
    readoutRepo.shotsInReview(a.teamId, EXAMPLES),
    listSticks(a),
    liveTrackingRuns(a.teamId, EXAMPLES),
  ]);
  const tasks: HomeTask[] = [];
  const clipTask = (key: HomeTask["key"], rows: typeof failed, title: (n: number) => string, href: string, to: (id: string) => string) => {
    if (rows.length) tasks.push({ key, count: rows[0].total, title: title(rows[0].total), href, examples: rows.map((c) => ({ label: clipName(c), href: to(c.id) })) });
  };
  clipTask("rateUnconfirmed", unconfirmed, (n) => `${plural(n, "clip")} ${n === 1 ? "waits" : "wait"} for the capture rate to be confirmed`, "/clips", (id) => `/clips/${id}`);
  clipTask("clipsFailed", failed, (n) => `${plural(n, "clip")} failed to process`, "/clips?status=failed", (id) => `/clips/${id}`);
  if (review.length) {
    const n = review[0].total;
    tasks.push({
      key: "shotsToReview", count: n, title: `${plural(n, "shot")} with results ${n === 1 ? "waits" : "wait"} for review before ${n === 1 ? "its player sees it" : "their players see them"}`,
      href: "/readout?review=waiting", examples: review.map((s) => ({ label: `${shotName(s)} — ${s.playerName ?? "no player"}`, href: `/readout/${s.id}` })),
    });
  }
  clipTask("clipsNotDigitised", notDigitised, (n) => `${plural(n, "clip")} ${n === 1 ? "is" : "are"} ready but not digitised yet`, "/clips?status=ready", (id) => `/clips/${id}/shots`);
  const soft = sticks.sticks.filter((s) => s.belowAlert);
  if (soft.length)
    tasks.push({
      key: "sticksBelowAlert", count: soft.length, title: `${plural(soft.length, "stick")} ${soft.length === 1 ? "has" : "have"} softened below the team's alert level (${sticks.flexAlertPercent} % of rated flex)`,
      href: "/sticks", examples: soft.slice(0, 3).map((s) => ({ label: s.label, href: `/sticks/${s.id}` })),
    });
  if (runs.length) {
    const n = runs[0].all;
    tasks.push({
      key: "trackingRunning", count: n, title: `${plural(n, "tracking run")} ${n === 1 ? "is" : "are"} under way`,
      href: `/clips/${runs[0].clipId}/shots/${runs[0].shotId}/digitise`,
      examples: runs.map((r) => ({ label: `${shotName(r)} — ${r.status === "queued" ? "queued" : r.total ? `${Math.round((100 * r.done) / r.total)} %` : "starting"}`, href: `/clips/${r.clipId}/shots/${r.shotId}/digitise` })),
    });
  }
  return tasks;
}

async function adminTasks(a: Actor): Promise<HomeTask[]> {
  const [invitations, seats] = await Promise.all([pendingInvitationsOf(a.teamId), staffSeatUse(a.teamId)]);
  const live = invitations.filter((i) => i.expiresAt.getTime() > Date.now());
  const tasks: HomeTask[] = [];
  if (live.length)
    tasks.push({
      key: "invitationsPending", count: live.length, title: `${plural(live.length, "invitation")} not yet accepted`,
      href: "/roster", examples: live.slice(0, 3).map((i) => ({ label: `${i.email} (${i.role ?? "player"})`, href: "/roster" })),
    });
  tasks.push({
    key: "staffSeats", count: seats.used, title: `${seats.used} of ${seats.seats} staff seats taken on the ${seats.planName} plan`,
    href: "/billing", examples: [],
  });
  return tasks;
}

async function playerHome(a: Actor): Promise<NonNullable<HomeResponse["player"]>> {
  const [visible, shared] = await Promise.all([
    readoutRepo.listShots(a, { playerId: a.userId }),
    readoutRepo.recentlySharedWith(a, new Date(Date.now() - SHARED_WITHIN_DAYS * 86_400_000)),
  ]);
  const own = visible.filter((r) => r.playerId === a.userId).map((r) => homeShot({ ...r, date: shotDate(r) }));
  const withResults = visible.filter((r) => r.playerId === a.userId && r.summary);
  const bests: HomeShot[] = [];
  for (const t of shotTypes) {
    const fastest = withResults
      .filter((r) => r.shotType === t && !implausible(r.summary))
      .reduce<(typeof withResults)[number] | null>((b, r) => (!b || r.summary!.puckExitSpeed.valueMps > b.summary!.puckExitSpeed.valueMps ? r : b), null);
    if (fastest) bests.push(homeShot({ ...fastest, date: shotDate(fastest) }));
  }
  return {
    latest: own.filter((s) => s.puckExitSpeedMps !== null).slice(0, 3),
    bests,
    shared: shared.map((r) => ({ ...homeShot(r), playerName: r.playerName, sharedAt: r.sharedAt.toISOString() })),
    ownShots: own.length,
  };
}

export async function home(a: Actor): Promise<HomeResponse> {
  if (!isStaff(a)) return { tasks: [], player: await playerHome(a) };
  const [staff, admin] = await Promise.all([staffTasks(a), policy.manageRoster(a) ? adminTasks(a) : Promise.resolve([])]);
  return { tasks: [...admin.filter((t) => t.key === "invitationsPending"), ...staff, ...admin.filter((t) => t.key !== "invitationsPending")], player: null };
}
