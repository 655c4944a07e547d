// The audit log's sentences, from the detail each area records ([CP] wording of our own).
import { describe, expect, it } from "vitest";
import { describeAudit, namesWithFormer } from "../../../src/features/audit/describe";
import type { AuditEntry } from "../../../src/features/audit/api/auditLog";

const names = new Map([["u-pat", "Pat Player"], ["u-sam", "Sam Second"], ["u-kim", "Kim Third"]]);
const entry = (action: string, detail: Record<string, unknown>, targetType = "member"): AuditEntry => ({
  id: action, action, targetType, targetId: "t", detail, createdAt: "2025-03-01T10:00:00Z", actorName: "Alex Admin",
});

describe("describeAudit", () => {
  it("names the people of role changes and removals", () => {
    expect(describeAudit(entry("member.role_changed", { userId: "u-pat", from: "player", to: "coach" }), names)).toEqual({
      group: "people", actor: "Alex Admin", text: "changed Pat Player’s role from player to coach",
    });
    expect(describeAudit(entry("member.removed", { userId: "u-gone" }), names).text).toBe("removed a former member from the team");
    // Removals record the name, so the log keeps it after the person has left.
    const removed = entry("member.removed", { userId: "u-gone", name: "Gale Gone" });
    expect(describeAudit(removed, names).text).toBe("removed Gale Gone from the team");
    const earlier = entry("member.role_changed", { userId: "u-gone", from: "player", to: "analyst" });
    expect(describeAudit(earlier, namesWithFormer([removed, earlier], names)).text).toBe("changed Gale Gone’s role from player to analyst");
    expect(describeAudit(entry("member.role_changed", { userId: "u-pat", from: "admin", to: "admin" }), names).text).toMatch(/from team admin to team admin/);
  });

  it("tells invitations apart, and who joined through one", () => {
    expect(describeAudit(entry("invitation.created", { email: "new@ravens.example", role: "analyst" }), names).text).toBe("invited new@ravens.example as analyst");
    expect(describeAudit(entry("invitation.resent", { email: "new@ravens.example", role: "analyst" }), names).text).toMatch(/^sent the invitation .* again/);
    expect(describeAudit(entry("invitation.cancelled", { email: "new@ravens.example" }), names).text).toBe("cancelled the invitation to new@ravens.example");
    const joined = describeAudit({ ...entry("member.joined", { email: "new@ravens.example", role: "player" }), actorName: null }, names);
    expect(joined).toEqual({ group: "people", actor: "new@ravens.example", text: "accepted an invitation and joined as player" });
  });

  it("says who published a shot and who took it back to review", () => {
    expect(describeAudit(entry("shot.published", { title: "Slap 1" }, "shot"), names)).toMatchObject({ group: "shares", text: "published “Slap 1” to its player" });
    expect(describeAudit(entry("shot.unpublished", { title: "Slap 1" }, "shot"), names).text).toMatch(/^took “Slap 1” back to review/);
  });

  it("says what a deletion took with it", () => {
    expect(describeAudit(entry("clip.deleted", { title: "Slap, side view", frameCount: 1200 }, "clip"), names)).toMatchObject({
      group: "deletions", text: `deleted the clip “Slap, side view” and its ${(1200).toLocaleString()} frames`,
    });
    expect(describeAudit(entry("clip.deleted", { title: "", originalName: "IMG_1.mov" }, "clip"), names).text).toBe("deleted the clip “IMG_1.mov”");
    expect(describeAudit(entry("shot.deleted", { label: "" }, "shot"), names).text).toBe("deleted the shot (unlabelled) with its marks and results");
    expect(describeAudit(entry("bench_test.deleted", { stickLabel: "Blue 85", testedOn: "2025-02-11" }, "bench_test"), names).text).toBe(
      "deleted a bench test of the stick “Blue 85” from 2025-02-11",
    );
  });

  it("lists who a shot was newly shared with, or that sharing ended", () => {
    const shared = entry("shot.shared", { title: "Wrist shot 3", with: ["u-pat", "u-sam", "u-kim"], added: ["u-sam", "u-kim", "u-x"] }, "shot");
    expect(describeAudit(shared, names)).toMatchObject({ group: "shares", text: "shared “Wrist shot 3” with Sam Second, Kim Third and a former member" });
    expect(describeAudit(entry("shot.shared", { title: "Wrist shot 3", with: ["u-pat"], added: [] }, "shot"), names).text).toBe("changed who can see “Wrist shot 3” (Pat Player)");
    expect(describeAudit(entry("shot.unshared", { title: "Wrist shot 3", userId: "u-pat", name: "Old Name" }, "shot"), names)).toMatchObject({ group: "shares", text: "stopped sharing “Wrist shot 3” with Pat Player" });
    expect(describeAudit(entry("shot.unshared", { title: "Wrist shot 3", userId: "u-gone", name: "Left Team" }, "shot"), names).text).toBe("stopped sharing “Wrist shot 3” with Left Team");
    expect(describeAudit(entry("shot.shared", { title: "Wrist shot 3", with: [], added: [] }, "shot"), names).text).toBe("stopped sharing “Wrist shot 3” with anyone");
  });

  it("still shows an action it does not know", () => {
    expect(describeAudit(entry("team.renamed", {}, "team"), names).text).toBe("team renamed (team)");
  });

  it("says whose a shot or clip became, with names as they were then", () => {
    const both = entry("shot.reassigned", { label: "Shot 1", player: { from: "u-gone", fromName: "Dana Departed", to: "u-sam" }, stick: { from: null, fromLabel: null, to: "k1", toLabel: "Pro 85" } }, "shot");
    expect(describeAudit(both, names)).toMatchObject({ group: "moves", text: "moved the shot “Shot 1” from Dana Departed to Sam Second, with the stick “Pro 85”" });
    const stick = entry("shot.reassigned", { label: "Shot 2", stick: { from: "k1", fromLabel: "Pro 85", to: null, toLabel: null } }, "shot");
    expect(describeAudit(stick, names).text).toBe("gave the shot “Shot 2” no stick recorded (was “Pro 85”)");
    const moved = entry("clip.player_changed", { title: "Slap", from: "u-pat", fromName: "Pat Player", to: "u-sam", shotsMoved: 3, shotsKept: 0 }, "clip");
    expect(describeAudit(moved, names).text).toBe("gave the clip “Slap” to Sam Second instead of Pat Player with its 3 shots");
    const kept = entry("clip.player_changed", { title: "Slap", from: "u-pat", to: "u-kim", shotsMoved: 0, shotsKept: 1 }, "clip");
    expect(describeAudit(kept, names).text).toBe("gave the clip “Slap” to Kim Third instead of Pat Player (its 1 shot stayed Pat Player’s)");
  });
});
