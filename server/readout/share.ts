// A coach publishes a shot to its player, shares it with teammates (and, if asked, the team's
// staff), and takes either back. Each change is one audit entry; each new recipient gets an e-mail
// unless they turned shot e-mails off. Who then sees the shot is decided in one place only:
// server/entities/shot/visibility.ts (a player, or a teammate it is shared with, once published).
import { isStaff, policy, type Actor } from "../auth/policy";
import { recordAudit } from "../entities/audit/repository";
import { env } from "../env";
import { forbidden, HttpError } from "../http/problem";
import { log } from "../log";
import { sendMail } from "../mail/mailer";
import { shotSharedMail } from "../mail/readout-templates";
import { getPrefs } from "../entities/user/prefs";
import { METRICS, formatWithU, readoutPath, shotTitle, type PublishResponse, type ShareResponse, type ShareShotBody } from "../../shared/schemas/readout";
import type { ShotResults } from "../../shared/schemas/shot-results";
import { shotDate } from "../entities/shot/date";
import * as memberRepo from "../entities/member/repository";
import * as repo from "../entities/shot/readout";
import { teamName } from "../entities/team/repository";
import { invalid, visibleShot } from "./service";

type Member = Awaited<ReturnType<typeof memberRepo.teamMembers>>[number];
type Visible = Awaited<ReturnType<typeof visibleShot>>;

const titleOf = (row: Visible["row"]) => shotTitle({ label: row.label, shotType: row.shotType, date: shotDate(row), playerName: row.playerName });

/** E-mail one person about the shot; answers whether it went and, if not, why. */
async function tell(a: Actor, v: Visible, to: Member, sharerName: string): Promise<{ mailed: boolean; note: string | null }> {
  const prefs = await getPrefs(to.userId);
  if (!prefs.notifyShotShared) return { mailed: false, note: "has turned off e-mails about shared shots" };
  try {
    await sendMail(
      shotSharedMail({
        to: to.email, name: to.name, sharerName, teamName: (await teamName(a.teamId)) ?? "your team", shotTitle: titleOf(v.row), ownShot: to.userId === v.row.playerId,
        headline: headline(v.row.results, prefs.units),
        url: env().PUBLIC_URL + readoutPath(v.row.id, a.teamId),
        settingsUrl: `${env().PUBLIC_URL}/settings`,
      }),
    );
    return { mailed: true, note: null };
  } catch (err) {
    // The share stands; the page says the e-mail did not go out.
    log.warn({ err, shotId: v.row.id, to: to.userId }, "could not send the shot-shared e-mail");
    return { mailed: false, note: "the e-mail could not be sent" };
  }
}

/** Publish if not yet published (one audit entry); true when this call published it. */
async function publish(a: Actor, v: Visible): Promise<boolean> {
  if (!(await repo.setPublished(a.teamId, v.row.id, true, a.userId))) return false;
  await recordAudit({ teamId: a.teamId, actorId: a.userId, action: "shot.published", targetType: "shot", targetId: v.row.id, detail: { title: titleOf(v.row), playerId: v.row.playerId } });
  return true;
}

export async function publishShot(a: Actor, shotId: string, o: { notify: boolean }): Promise<PublishResponse> {
  const v = await visibleShot(a, shotId);
  if (!policy.publishShot(a, v.row)) throw forbidden("Only a coach or a team admin publishes shots to players.");
  const members = await memberRepo.teamMembers(a.teamId);
  const published = await publish(a, v);
  let outcome: { mailed: boolean; note: string | null } = { mailed: false, note: published ? null : "it was already published" };
  const p = v.row.playerId ? members.find((m) => m.userId === v.row.playerId) : undefined;
  if (published && !v.row.playerId) outcome = { mailed: false, note: "this shot has no player yet" };
  else if (published && !p) outcome = { mailed: false, note: "its player is no longer a member of this team" };
  else if (published && o.notify && p && p.userId !== a.userId) outcome = await tell(a, v, p, members.find((m) => m.userId === a.userId)?.name ?? "A coach");
  const after = await visibleShot(a, shotId);
  return { publication: publicationOf(after.row), ...outcome };
}

/** Back to review: its player and every teammate it was shared with stop seeing it (the shares stay, for a later publish). */
export async function unpublishShot(a: Actor, shotId: string): Promise<PublishResponse> {
  const v = await visibleShot(a, shotId);
  if (!policy.publishShot(a, v.row)) throw forbidden("Only a coach or a team admin takes shots back from players.");
  if (await repo.setPublished(a.teamId, shotId, false, null))
    await recordAudit({ teamId: a.teamId, actorId: a.userId, action: "shot.unpublished", targetType: "shot", targetId: shotId, detail: { title: titleOf(v.row), playerId: v.row.playerId } });
  return { publication: null, mailed: false, note: null };
}

const publicationOf = (row: Visible["row"]) => (row.publishedAt ? { publishedAt: row.publishedAt.toISOString(), publishedByName: row.publishedByName } : null);

export async function shareShot(a: Actor, shotId: string, body: { player: boolean; staff: boolean; teammates: string[] } & ShareShotBody): Promise<ShareResponse> {
  const v = await visibleShot(a, shotId);
  const { row } = v;
  if (!policy.shareShot(a, row)) throw forbidden("Only a coach or a team admin shares shots.");
  const members = await memberRepo.teamMembers(a.teamId);
  const targets = new Map<string, Member>();
  if (body.player) {
    if (!row.playerId) throw invalid("player", "this shot has no player yet: set its player on the Digitise page, or share it with teammates or the team's staff");
    const p = members.find((m) => m.userId === row.playerId);
    if (!p) throw invalid("player", "the shot's player is no longer a member of this team");
    if (p.userId !== a.userId) targets.set(p.userId, p);
  }
  for (const id of new Set(body.teammates)) {
    const m = members.find((x) => x.userId === id);
    if (!m) throw invalid("teammates", "one of the teammates is not a member of this team");
    if (m.role !== "player") throw invalid("teammates", `${m.name} is on the team's staff and sees every shot already; choose players`);
    if (m.userId === row.playerId) throw invalid("teammates", `${m.name} took this shot; share with the player instead`);
    targets.set(m.userId, m);
  }
  if (body.staff) for (const m of members) if (m.userId !== a.userId && isStaff({ ...a, role: m.role as Actor["role"] })) targets.set(m.userId, m);
  if (!targets.size) throw invalid(body.staff ? "staff" : "player", "there is nobody else to share this shot with");

  // A player (the shot's own, or a teammate) only sees a published shot: sharing with one publishes it.
  const toPlayers = body.player || body.teammates.length > 0;
  const published = toPlayers ? await publish(a, v) : false;
  const added = new Set(await repo.addShares({ teamId: a.teamId, shotId, userIds: [...targets.keys()], sharedBy: a.userId }));
  await recordAudit({
    teamId: a.teamId, actorId: a.userId, action: "shot.shared", targetType: "shot", targetId: shotId,
    detail: { title: titleOf(row), with: [...targets.keys()], added: [...added] },
  });

  const sharer = members.find((m) => m.userId === a.userId)?.name ?? "A coach";
  const recipients: ShareResponse["recipients"] = [];
  for (const t of targets.values()) {
    if (!added.has(t.userId)) {
      recipients.push({ userId: t.userId, name: t.name, role: t.role, added: false, mailed: false, note: "already shared; no new e-mail" });
      continue;
    }
    recipients.push({ userId: t.userId, name: t.name, role: t.role, added: true, ...(await tell(a, v, t, sharer)) });
  }
  return { recipients, published };
}

function headline(r: ShotResults | null, units: "metric" | "imperial"): string | null {
  if (!r) return null;
  const m = METRICS[0];
  const v = m.read(r)!;
  return `${m.label} ${formatWithU(m.kind, v.value, v.u, units)}`;
}

/** A coach or team admin stops sharing a shot with one person; staff keep seeing it through their role. */
export async function unshareShot(a: Actor, shotId: string, userId: string): Promise<void> {
  const { row, shares } = await visibleShot(a, shotId);
  if (!policy.shareShot(a, row)) throw forbidden("Only a coach or a team admin changes who a shot is shared with.");
  const gone = shares.find((s) => s.userId === userId);
  if (!gone || !(await repo.removeShare(a.teamId, shotId, userId))) throw new HttpError(404, "not_found", "This shot is not shared with that person.");
  await recordAudit({ teamId: a.teamId, actorId: a.userId, action: "shot.unshared", targetType: "shot", targetId: shotId, detail: { title: titleOf(row), userId, name: gone.name } });
}
