// An audit entry as one plain sentence for the team admin, plus the group it belongs to for the
// filter. Pure, so it is tested without a DOM.
import { parseRole, roleLabels } from "@shared/schemas/roster";
import type { AuditEntry } from "./api/auditLog";

export type AuditGroup = "people" | "deletions" | "shares" | "moves" | "plan";
export const groupLabels: Record<AuditGroup, string> = {
  people: "Members and invitations", deletions: "Deletions", shares: "Shares", moves: "Player and stick changes", plan: "Plan and payments",
};

const planNames: Record<string, string> = { pond: "Pond", rink: "Rink", arena: "Arena" };
const planName = (v: unknown) => (typeof v === "string" && planNames[v]) || "another plan";
const dateOf = (v: unknown) => (typeof v === "string" ? new Date(v).toLocaleDateString(undefined, { dateStyle: "medium" }) : "the period's end");
/** Plan changes come from the payment service, not from a person. */
const SERVICE = "Payments";

const str = (v: unknown) => (typeof v === "string" && v.trim() ? v : null);
const role = (v: unknown) => {
  const r = typeof v === "string" ? parseRole(v) : null;
  return r ? roleLabels[r].toLowerCase() : "another role";
};
const quoted = (v: unknown, fallback: string) => (str(v) ? `“${str(v)}”` : fallback);

function listOf(names: string[]): string {
  if (names.length <= 2) return names.join(" and ");
  return `${names.slice(0, -1).join(", ")} and ${names.at(-1)}`;
}

export interface Described {
  group: AuditGroup;
  /** Who did it ("Someone" for an action without a signed-in actor, e.g. an accepted invitation). */
  actor: string;
  /** What they did, starting with a verb. */
  text: string;
}

/** Today's members plus the people the log itself remembers (a removal keeps the name it had then). */
export function namesWithFormer(entries: readonly AuditEntry[], members: ReadonlyMap<string, string>): Map<string, string> {
  const out = new Map(members);
  for (const e of entries) {
    const d = e.detail ?? {};
    if (e.action === "member.removed" && typeof d.userId === "string" && typeof d.name === "string" && !out.has(d.userId)) out.set(d.userId, d.name);
  }
  return out;
}

export function describeAudit(e: AuditEntry, names: ReadonlyMap<string, string>): Described {
  const d = e.detail ?? {};
  const person = (id: unknown) => (typeof id === "string" && names.get(id)) || "a former member";
  const actor = e.actorName ?? "Someone";
  switch (e.action) {
    case "member.role_changed":
      return { group: "people", actor, text: `changed ${person(d.userId)}’s role from ${role(d.from)} to ${role(d.to)}` };
    case "member.removed": {
      // The name as it was then: once removed, the person is no longer among the team's members.
      const who = (typeof d.userId === "string" && names.get(d.userId)) || str(d.name) || "a former member";
      return { group: "people", actor, text: `removed ${who} from the team` };
    }
    case "member.joined":
      return { group: "people", actor: str(d.email) ?? "Someone", text: `accepted an invitation and joined as ${role(d.role)}` };
    case "invitation.created":
      return { group: "people", actor, text: `invited ${str(d.email) ?? "someone"} as ${role(d.role)}` };
    case "invitation.resent":
      return { group: "people", actor, text: `sent the invitation to ${str(d.email) ?? "someone"} again (as ${role(d.role)})` };
    case "invitation.cancelled":
      return { group: "people", actor, text: `cancelled the invitation to ${str(d.email) ?? "someone"}` };
    case "clip.deleted": {
      const frames = typeof d.frameCount === "number" ? ` and its ${d.frameCount.toLocaleString()} frames` : "";
      return { group: "deletions", actor, text: `deleted the clip ${quoted(str(d.title) ?? d.originalName, "(untitled)")}${frames}` };
    }
    case "shot.deleted":
      return { group: "deletions", actor, text: `deleted the shot ${quoted(d.label, "(unlabelled)")} with its marks and results` };
    case "stick.deleted":
      return { group: "deletions", actor, text: `deleted the stick ${quoted(d.label, "(unlabelled)")} and its bench tests` };
    case "bench_test.deleted":
      return { group: "deletions", actor, text: `deleted a bench test of the stick ${quoted(d.stickLabel, "(unlabelled)")}${str(d.testedOn) ? ` from ${d.testedOn}` : ""}` };
    case "shot.shared": {
      const added = Array.isArray(d.added) ? d.added : [];
      const all = Array.isArray(d.with) ? d.with : [];
      const who = (added.length ? added : all).map(person);
      const title = quoted(d.title, "a shot");
      if (!all.length) return { group: "shares", actor, text: `stopped sharing ${title} with anyone` };
      return { group: "shares", actor, text: added.length ? `shared ${title} with ${listOf(who)}` : `changed who can see ${title} (${listOf(who)})` };
    }
    case "shot.unshared": {
      // The name as it was then, when the person has since left the team.
      const who = (typeof d.userId === "string" && names.get(d.userId)) || str(d.name) || "a former member";
      return { group: "shares", actor, text: `stopped sharing ${quoted(d.title, "a shot")} with ${who}` };
    }
    case "shot.reassigned": {
      // Names and labels as they were then, when the person or stick has since gone.
      const p = d.player as { from?: unknown; fromName?: unknown; to?: unknown } | undefined;
      const k = d.stick as { fromLabel?: unknown; toLabel?: unknown; to?: unknown } | undefined;
      const who = (id: unknown, then?: unknown) => (id === null ? "no player" : (typeof id === "string" && names.get(id)) || str(then) || "a former member");
      const shot = `the shot ${quoted(d.label, "(unlabelled)")}`;
      const stick = k ? `${k.to === null ? "no stick recorded" : `the stick ${quoted(k.toLabel, "(unlabelled)")}`}${str(k.fromLabel) ? ` (was ${quoted(k.fromLabel, "")})` : ""}` : "";
      if (p) return { group: "moves", actor, text: `moved ${shot} from ${who(p.from, p.fromName)} to ${who(p.to)}${k ? `, with ${stick}` : ""}` };
      return { group: "moves", actor, text: `gave ${shot} ${stick}` };
    }
    case "clip.player_changed": {
      const moved = typeof d.shotsMoved === "number" ? d.shotsMoved : 0;
      const kept = typeof d.shotsKept === "number" ? d.shotsKept : 0;
      const from = (typeof d.from === "string" && names.get(d.from)) || str(d.fromName) || "no player";
      const shots = (n: number) => (n === 1 ? "its 1 shot" : `its ${n} shots`);
      const tail = moved ? ` with ${shots(moved)}` : kept ? ` (${shots(kept)} stayed ${from}’s)` : "";
      return { group: "moves", actor, text: `gave the clip ${quoted(d.title, "(untitled)")} to ${person(d.to)} instead of ${from}${tail}` };
    }
    case "shot.published":
      return { group: "shares", actor, text: `published ${quoted(d.title, "a shot")} to its player` };
    case "shot.unpublished":
      return { group: "shares", actor, text: `took ${quoted(d.title, "a shot")} back to review (its player and teammates no longer see it)` };
    case "plan.changed":
      return { group: "plan", actor: SERVICE, text: `moved the club from ${planName(d.from)} to ${planName(d.to)}` };
    case "plan.cancel_scheduled":
      return { group: "plan", actor: SERVICE, text: `recorded that ${planName(d.plan)} ends on ${dateOf(d.endsAt)} (cancelled by a team admin)` };
    case "plan.cancel_withdrawn":
      return { group: "plan", actor: SERVICE, text: `recorded that ${planName(d.plan)} goes on (the cancellation was withdrawn)` };
    case "billing.payment_failed":
      return { group: "plan", actor: SERVICE, text: `reported a failed renewal payment; everything keeps working until ${dateOf(d.graceEndsAt)}` };
    case "billing.read_only":
      return { group: "plan", actor: SERVICE, text: "made the club's teams read-only until the open invoice is paid (nothing deleted)" };
    case "billing.restored":
      return { group: "plan", actor: SERVICE, text: "recorded the payment: the club's teams are fully usable again" };
    case "team.created":
      return { group: "people", actor, text: `added the team ${quoted(d.name, "(unnamed)")} to the club` };
    default:
      return { group: e.targetType === "shot" ? "shares" : "people", actor, text: `${e.action.replace(/[._]/g, " ")} (${e.targetType})` };
  }
}
