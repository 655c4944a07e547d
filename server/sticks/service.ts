// Sticks and the team's flex alert level. Staff see and edit every stick of the team; a player
// sees only their own (policy.viewStick); another team's stick is simply not found.
import { policy, type Actor } from "../auth/policy";
import { recordAudit } from "../entities/audit/repository";
import { forbidden, HttpError, notFound } from "../http/problem";
import {
  DEFAULT_FLEX_ALERT_PERCENT,
  type StickCreate,
  type StickDetail,
  type StickPatch,
  type StickRow,
  type StickSettings,
  type SticksResponse,
} from "../../shared/schemas/sticks";
import { StickCreateSchema } from "../../shared/schemas/sticks";
import { presentBenchTest, presentStick } from "./present";
import * as memberRepo from "../entities/member/repository";
import * as repo from "../entities/stick/repository";
import { setFlexAlertPercent, teamSettingsOf } from "../entities/team/repository";
import { stickStiffnessChanged } from "./stiffness";

export const flexAlertPercent = async (teamId: string) => (await teamSettingsOf(teamId)).flexAlertPercent ?? DEFAULT_FLEX_ALERT_PERCENT;

/** The stick if the actor may see it; 404 otherwise (a player asking for another's stick learns nothing). */
export async function visibleStick(a: Actor, stickId: string) {
  const row = await repo.stickById(a.teamId, stickId);
  if (!row || !policy.viewStick(a, row.stick)) throw notFound("That stick");
  return row;
}

/** The stick if the actor may edit it: 404 when they cannot see it, 403 when they only can see it. */
export async function editableStick(a: Actor, stickId: string, can: (a: Actor, s: { teamId: string }) => boolean = policy.editStick) {
  const row = await visibleStick(a, stickId);
  if (!can(a, row.stick)) throw forbidden("Only the team's staff can change sticks and run bench tests.");
  return row;
}

async function checkOwner(teamId: string, ownerId: string | null | undefined) {
  if (!ownerId) return;
  const players = await memberRepo.playersOf(teamId);
  if (!players.some((p) => p.id === ownerId))
    throw new HttpError(422, "validation_failed", "ownerId: the owner must be a player of this team", [
      { path: "ownerId", message: "The owner must be a player of this team" },
    ]);
}

async function rowsFor(a: Actor, sticks: Awaited<ReturnType<typeof repo.sticksOf>>): Promise<StickRow[]> {
  const ids = sticks.map((s) => s.stick.id);
  const [tests, counts, alert] = await Promise.all([repo.benchTestsOf(a.teamId, ids), repo.shotCountsOf(a.teamId, ids), flexAlertPercent(a.teamId)]);
  return sticks.map(({ stick, ownerName }) =>
    presentStick(stick, ownerName, tests.filter((t) => t.test.stickId === stick.id).map((t) => t.test), counts.get(stick.id) ?? 0, alert),
  );
}

export async function listSticks(a: Actor): Promise<SticksResponse> {
  const staff = policy.editStick(a, { teamId: a.teamId });
  const sticks = await repo.sticksOf(a.teamId, staff ? undefined : a.userId);
  return {
    sticks: await rowsFor(a, sticks),
    flexAlertPercent: await flexAlertPercent(a.teamId),
    players: staff ? await memberRepo.playersOf(a.teamId) : [],
    canEdit: staff,
    canManageSettings: policy.manageTeamSettings(a),
  };
}

export async function stickDetail(a: Actor, stickId: string): Promise<StickDetail> {
  const row = await visibleStick(a, stickId);
  const staff = policy.editStick(a, row.stick);
  const [[stick], tests, shotsByDate, shots, alert] = await Promise.all([
    rowsFor(a, [row]),
    repo.benchTestsOf(a.teamId, [stickId]),
    repo.shotsByDateOf(a, stickId),
    repo.shotsWithStick(a, stickId),
    flexAlertPercent(a.teamId),
  ]);
  return {
    stick,
    benchTests: tests.map((t) => presentBenchTest(t.test, row.stick.ratedFlex, t.createdByName)),
    shotsByDate,
    shots: shots.map((s) => ({
      id: s.id,
      label: s.label,
      date: s.date,
      player: s.playerId && s.playerName ? { id: s.playerId, name: s.playerName } : null,
      hasDeflection: s.hasDeflection,
    })),
    flexAlertPercent: alert,
    canEdit: staff,
  };
}

export async function createStick(a: Actor, body: StickCreate): Promise<StickRow> {
  if (!policy.editStick(a, { teamId: a.teamId })) throw forbidden("Only the team's staff can add sticks.");
  const values = StickCreateSchema.parse(body);
  await checkOwner(a.teamId, values.ownerId);
  const created = await repo.insertStick(a.teamId, values);
  return (await stickDetail(a, created.id)).stick;
}

export async function updateStick(a: Actor, stickId: string, patch: StickPatch): Promise<StickRow> {
  const before = (await editableStick(a, stickId)).stick;
  await checkOwner(a.teamId, patch.ownerId);
  await repo.updateStick(a.teamId, stickId, patch);
  // Without a bench test, shots use the rating: a new rating changes their stiffness.
  if (patch.ratedFlex !== undefined && patch.ratedFlex !== before.ratedFlex) await stickStiffnessChanged(a.teamId, stickId);
  return (await stickDetail(a, stickId)).stick;
}

export async function deleteStick(a: Actor, stickId: string): Promise<void> {
  const { stick } = await editableStick(a, stickId);
  const shotIds = await repo.shotIdsWithStick(stickId, a.teamId);
  await repo.deleteStick(a.teamId, stickId);
  await stickStiffnessChanged(a.teamId, stickId, shotIds);
  await recordAudit({ teamId: a.teamId, actorId: a.userId, action: "stick.deleted", targetType: "stick", targetId: stickId, detail: { label: stick.label } });
}

export async function updateSettings(a: Actor, body: StickSettings): Promise<StickSettings> {
  if (!policy.manageTeamSettings(a)) throw forbidden("Only a team admin can change the flex alert level.");
  await setFlexAlertPercent(a.teamId, body.flexAlertPercent);
  return { flexAlertPercent: body.flexAlertPercent };
}
