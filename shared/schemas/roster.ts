import { z } from "zod";
import { humanText, opaqueId, TEXT_LIMITS } from "./text";

export const roles = ["admin", "coach", "analyst", "player"] as const;
export const RoleSchema = z.enum(roles, { message: "Role must be team admin, coach, analyst or player" });
export type Role = z.infer<typeof RoleSchema>;

/**
 * A member's role as stored by better-auth: a comma-separated list of which Loadframe gives each
 * member one. The first entry, trimmed; null when it is not a role we know (such a member gets no
 * access; lists show the least role, player, so a team admin can see and fix it).
 */
export function parseRole(stored: string | null | undefined): Role | null {
  const parsed = RoleSchema.safeParse((stored ?? "").split(",")[0]?.trim());
  return parsed.success ? parsed.data : null;
}

export const roleLabels: Record<Role, string> = { admin: "Team admin", coach: "Coach", analyst: "Analyst", player: "Player" };
export const roleDescriptions: Record<Role, string> = {
  admin: "Members, roles, invitations and team settings; everything a coach can do.",
  coach: "All of the team's clips, shots and sticks; shares shots with players.",
  analyst: "Uploads clips, digitises shots, runs bench tests.",
  player: "Sees own shots and those shared with them; compares own shots.",
};

export const EmailSchema = z.string({ error: "Enter your e-mail address" }).trim().toLowerCase().max(254, "An e-mail address has at most 254 characters").email("Enter a valid e-mail address");

export const InviteBodySchema = z.object({ email: EmailSchema, role: RoleSchema });
export const RoleChangeBodySchema = z.object({ role: RoleSchema });
export const ActiveTeamBodySchema = z.object({ teamId: opaqueId("teamId", "Choose a team") });
/** A person's name as shown on rosters, lists, mails and PDFs. */
export const PersonNameSchema = humanText({ field: "Name", max: TEXT_LIMITS.name, min: 1, minMessage: "Enter your name" });
export const PasswordSchema = z.string().min(10, "Use at least 10 characters").max(128, "Use at most 128 characters");
export const AcceptInvitationBodySchema = z.object({
  name: PersonNameSchema.optional(),
  password: PasswordSchema.optional(),
});
export const PrefsBodySchema = z
  .object({
    units: z.enum(["metric", "imperial"]),
    notifyClipReady: z.boolean(),
    notifyShotShared: z.boolean(),
  })
  .partial()
  .strict();

export interface TeamSummary { id: string; name: string; slug: string; role: Role }
export interface Prefs { units: "metric" | "imperial"; notifyClipReady: boolean; notifyShotShared: boolean }
export interface MeResponse {
  user: { id: string; name: string; email: string };
  prefs: Prefs;
  teams: TeamSummary[];
  activeTeamId: string | null;
}
export interface MemberRow { id: string; userId: string; name: string; email: string; role: Role; joinedAt: string }
export interface InvitationRow { id: string; email: string; role: Role; status: string; expiresAt: string; invitedBy: string }
export interface RosterResponse { members: MemberRow[]; invitations: InvitationRow[] }
export interface InvitationPublic {
  id: string; email: string; teamName: string; role: Role; inviterName: string; status: string; expiresAt: string; hasAccount: boolean;
}
