// A coach shares a shot with its player (and, if asked, the team's staff): share rows, one audit
// entry, and an e-mail to each new recipient who has not turned shot e-mails off.
import { isStaff, policy, type Actor } from "../auth/policy";
import { recordAudit } from "../audit/repository";
import { env } from "../env";
import { forbidden, HttpError } from "../http/problem";
import { log } from "../log";
import { sendMail } from "../mail/mailer";
import { shotSharedMail } from "../mail/readout-templates";
import { getPrefs } from "../me/repository";
import { METRICS, formatWithU, readoutPath, shotTitle, type ShareResponse, type ShareShotBody } from "../../shared/schemas/readout";
import type { ShotResults } from "../../shared/schemas/shot-results";
import { shotDate } from "../entities/shot/date";
import * as memberRepo from "../entities/member/repository";
import * as repo from "./repository";
import { invalid, visibleShot } from "./service";

export async function shareShot(a: Actor, shotId: string, body: { player: boolean; staff: boolean } & ShareShotBody): Promise<ShareResponse> {
  const { row } = await visibleShot(a, shotId);
  if (!policy.shareShot(a, row)) throw forbidden("Only a coach or a team admin shares shots.");
  const members = await memberRepo.teamMembers(a.teamId);
  const targets = new Map<string, (typeof members)[number]>();
  if (body.player) {
    if (!row.playerId) throw invalid("player", "this shot has no player yet: set its player on the Digitise page, or share it with the team's staff only");
    const p = members.find((m) => m.userId === row.playerId);
    if (!p) throw invalid("player", "the shot's player is no longer a member of this team");
    if (p.userId !== a.userId) targets.set(p.userId, p);
  }
  if (body.staff) for (const m of members) if (m.userId !== a.userId && isStaff({ ...a, role: m.role as Actor["role"] })) targets.set(m.userId, m);
  if (!targets.size) throw invalid(body.staff ? "staff" : "player", "there is nobody else to share this shot with");

  const added = new Set(await repo.addShares({ teamId: a.teamId, shotId, userIds: [...targets.keys()], sharedBy: a.userId }));
  const title = shotTitle({ label: row.label, shotType: row.shotType, date: shotDate(row), playerName: row.playerName });
  await recordAudit({
    teamId: a.teamId, actorId: a.userId, action: "shot.shared", targetType: "shot", targetId: shotId,
    detail: { title, with: [...targets.keys()], added: [...added] },
  });

  const sharer = members.find((m) => m.userId === a.userId)?.name ?? "A coach";
  const teamName = await repo.teamName(a.teamId);
  const recipients: ShareResponse["recipients"] = [];
  for (const t of targets.values()) {
    const r = { userId: t.userId, name: t.name, role: t.role, added: added.has(t.userId), mailed: false, note: null as string | null };
    recipients.push(r);
    if (!r.added) {
      r.note = "already shared; no new e-mail";
      continue;
    }
    const prefs = await getPrefs(t.userId);
    if (!prefs.notifyShotShared) {
      r.note = "has turned off e-mails about shared shots";
      continue;
    }
    try {
      await sendMail(
        shotSharedMail({
          to: t.email, name: t.name, sharerName: sharer, teamName, shotTitle: title, ownShot: t.userId === row.playerId,
          headline: headline(row.results, prefs.units),
          url: env().PUBLIC_URL + readoutPath(shotId, a.teamId),
          settingsUrl: `${env().PUBLIC_URL}/settings`,
        }),
      );
      r.mailed = true;
    } catch (err) {
      // The share stands; the page says the e-mail did not go out.
      log.warn({ err, shotId, to: t.userId }, "could not send the shot-shared e-mail");
      r.note = "the e-mail could not be sent";
    }
  }
  return { recipients };
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
  const title = shotTitle({ label: row.label, shotType: row.shotType, date: shotDate(row), playerName: row.playerName });
  await recordAudit({ teamId: a.teamId, actorId: a.userId, action: "shot.unshared", targetType: "shot", targetId: shotId, detail: { title, userId, name: gone.name } });
}
