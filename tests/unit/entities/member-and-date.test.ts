// The pure halves of two entity rules: a member's stored role, and a shot's date.
import { describe, expect, it } from "vitest";
import { parseRole } from "../../../shared/schemas/roster";
import { shotDate } from "../../../server/entities/shot/date";

describe("parseRole: the one reading of a stored role", () => {
  it.each([
    ["coach", "coach"],
    [" player ", "player"],
    ["analyst,player", "analyst"],
    ["admin, coach", "admin"],
    ["owner", null],
    ["", null],
    [null, null],
  ] as const)("%j → %j", (stored, role) => expect(parseRole(stored)).toBe(role));
});

describe("shotDate: the session's date as written, else the clip's upload day (UTC)", () => {
  it("keeps the session's calendar date whatever the clock says", () =>
    expect(shotDate({ sessionDate: "2026-02-27", clipCreatedAt: new Date("2026-03-01T23:59:00Z") })).toBe("2026-02-27"));
  it("uses the upload day without a session", () =>
    expect(shotDate({ sessionDate: null, clipCreatedAt: new Date("2026-03-01T23:59:00Z") })).toBe("2026-03-01"));
});
