import { auth } from "../auth/auth";
import type { SignedIn } from "../auth/context";
import { policy, type Actor } from "../auth/policy";
import { recordAudit } from "../entities/audit/repository";
import { createAccount } from "../auth/accounts";
import { deleteUser, markEmailVerified, userContact, userIdByEmail } from "../entities/user/account";
import { teamMembers } from "../entities/member/repository";
import { mergeSetCookies, viaAuth } from "../http/better-auth-errors";
import { forbidden, HttpError, notFound } from "../http/problem";
import { type InvitationPublic, type Role, type RosterResponse } from "../../shared/schemas/roster";
import { parseRole, roleForList } from "../entities/member/role";
import * as repo from "../entities/member/membership";
import { assertStaffSeat, withSeatLock } from "../billing/limits";

const asRole = roleForList;

function requireAdmin(a: Actor) {
  if (!policy.manageRoster(a)) throw forbidden("Only a team admin can manage the roster.");
}

export async function roster(a: Actor): Promise<RosterResponse> {
  if (!policy.viewMembers(a)) throw forbidden("Players cannot see the roster.");
  const members = (await teamMembers(a.teamId)).map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() }));
  const invitations = policy.manageRoster(a)
    ? (await repo.pendingInvitationsOf(a.teamId)).map((i) => ({ ...i, role: asRole(i.role), expiresAt: i.expiresAt.toISOString() }))
    : [];
  return { members, invitations };
}

export async function invite(a: Actor, headers: Headers, email: string, role: Role, resend = false) {
  requireAdmin(a);
  if (await repo.memberByEmail(a.teamId, email)) throw new HttpError(409, "already_member", `${email} is already a member of this team.`);
  const inv = await withSeatLock(a.teamId, async () => {
    await assertStaffSeat(a.teamId, email, role);
    if (!resend && (await repo.pendingInvitationFor(a.teamId, email)))
      throw new HttpError(409, "already_invited", `${email} already has a pending invitation. Use "Resend" to send it again.`);
    return viaAuth(() => auth().api.createInvitation({ headers, body: { email, role, organizationId: a.teamId, resend } }));
  });
  await recordAudit({ teamId: a.teamId, actorId: a.userId, action: resend ? "invitation.resent" : "invitation.created", targetType: "invitation", targetId: inv.id, detail: { email, role } });
  return { id: inv.id, email: inv.email, role: asRole(inv.role), status: inv.status, expiresAt: new Date(inv.expiresAt).toISOString() };
}

async function invitationInTeam(a: Actor, invitationId: string) {
  const inv = await repo.invitationById(invitationId);
  if (!inv || inv.teamId !== a.teamId) throw notFound("That invitation");
  return inv;
}

export async function resendInvitation(a: Actor, headers: Headers, invitationId: string) {
  requireAdmin(a);
  const inv = await invitationInTeam(a, invitationId);
  if (inv.status !== "pending") throw new HttpError(409, "invitation_closed", "That invitation is no longer pending.");
  return invite(a, headers, inv.email, asRole(inv.role), true);
}

export async function cancelInvitation(a: Actor, headers: Headers, invitationId: string) {
  requireAdmin(a);
  const inv = await invitationInTeam(a, invitationId);
  await viaAuth(() => auth().api.cancelInvitation({ headers, body: { invitationId } }));
  await recordAudit({ teamId: a.teamId, actorId: a.userId, action: "invitation.cancelled", targetType: "invitation", targetId: invitationId, detail: { email: inv.email } });
}

/** The member, or 404; refuses to leave the team without an admin. Runs inside changeMembership. */
function guardLastAdmin(members: repo.MemberRow[], memberId: string, nextRole: Role | null) {
  const m = members.find((x) => x.id === memberId);
  if (!m) throw notFound("That member");
  const admins = members.filter((x) => parseRole(x.role) === "admin");
  if (parseRole(m.role) === "admin" && nextRole !== "admin" && admins.length <= 1)
    throw new HttpError(409, "last_admin", "A team needs at least one team admin. Make someone else team admin first.");
  return m;
}

export async function changeRole(a: Actor, memberId: string, role: Role) {
  requireAdmin(a);
  return withSeatLock(a.teamId, () => repo.changeMembership(a.teamId, async (members, tx) => {
    const m = guardLastAdmin(members, memberId, role);
    await assertStaffSeat(a.teamId, (await userContact(m.userId))?.email ?? "", role);
    await repo.setMemberRole(tx, memberId, role);
    return {
      result: { id: memberId, role },
      audit: { actorId: a.userId, action: "member.role_changed", targetType: "member", targetId: memberId, detail: { from: m.role, to: role, userId: m.userId } },
    };
  }));
}

export async function removeMember(a: Actor, memberId: string) {
  requireAdmin(a);
  await repo.changeMembership(a.teamId, async (members, tx) => {
    const m = guardLastAdmin(members, memberId, null);
    // The name, e-mail and role as they were: once removed, the log is the only place that keeps them.
    const who = await userContact(m.userId, tx);
    await repo.deleteMember(tx, memberId);
    return {
      result: undefined,
      audit: { actorId: a.userId, action: "member.removed", targetType: "member", targetId: memberId, detail: { userId: m.userId, name: who?.name, email: who?.email, role: m.role } },
    };
  });
}

// --- the invitee's side ---------------------------------------------------------------------

async function openInvitation(id: string) {
  const inv = await repo.invitationById(id);
  if (!inv) throw notFound("That invitation");
  if (inv.status === "accepted") throw new HttpError(410, "invitation_used", "This invitation has already been used. Sign in instead.");
  if (inv.status !== "pending") throw new HttpError(410, "invitation_cancelled", "This invitation was cancelled. Ask your team admin for a new one.");
  if (inv.expiresAt.getTime() < Date.now()) throw new HttpError(410, "invitation_expired", "This invitation has expired. Ask your team admin to resend it.");
  return inv;
}

export async function publicInvitation(id: string): Promise<InvitationPublic> {
  const inv = await openInvitation(id);
  return {
    id: inv.id, email: inv.email, teamName: inv.teamName, role: asRole(inv.role), inviterName: inv.inviterName,
    status: inv.status, expiresAt: inv.expiresAt.toISOString(), hasAccount: (await userIdByEmail(inv.email)) !== null,
  };
}

/**
 * Accept as the signed-in user, or create the account first (the mailed link proves the address);
 * returns cookies to set. A new account whose joining fails is removed again: nothing half-made.
 */
export async function acceptInvitation(id: string, signedIn: SignedIn | null, headers: Headers, body: { name?: string; password?: string }) {
  const inv = await openInvitation(id);
  let authHeaders = headers;
  let setCookies: string[] = [];
  let userId: string;
  let created = false;
  if (signedIn) {
    if (signedIn.user.email.toLowerCase() !== inv.email.toLowerCase())
      throw new HttpError(403, "wrong_account", `This invitation is for ${inv.email}. Sign out and open the link again.`);
    userId = signedIn.user.id;
  } else {
    if ((await userIdByEmail(inv.email)) !== null) throw new HttpError(409, "account_exists", `An account for ${inv.email} exists. Sign in, then open the link again.`);
    if (!body.name || !body.password)
      throw new HttpError(422, "validation_failed", "Enter your name and a password.", [
        ...(!body.name ? [{ path: "name", message: "Enter your name" }] : []),
        ...(!body.password ? [{ path: "password", message: "Choose a password" }] : []),
      ]);
    const account = await createAccount({ email: inv.email, name: body.name, password: body.password, emailVerified: true, signIn: true });
    ({ userId, setCookies } = account);
    created = true;
    authHeaders = new Headers({ cookie: setCookies.map((c) => c.split(";")[0]).join("; "), origin: headers.get("origin") ?? "" });
  }
  try {
    const joined = await repo.joinByInvitation(id, userId, { email: inv.email });
    if (!joined) throw new HttpError(410, "invitation_used", "This invitation has already been used. Sign in instead.");
  } catch (err) {
    if (created) await deleteUser(userId);
    throw err;
  }
  // Opening the mailed link while signed in to that address proves it as well.
  if (!created) await markEmailVerified(userId);
  const { headers: active } = await viaAuth(() => auth().api.setActiveOrganization({ headers: authHeaders, body: { organizationId: inv.teamId }, returnHeaders: true }));
  setCookies = mergeSetCookies(setCookies, active.getSetCookie());
  return { teamId: inv.teamId, setCookies };
}
