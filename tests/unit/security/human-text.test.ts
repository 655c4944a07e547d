// The one schema for text people type: caps, and the characters it refuses, as a table.
import { describe, expect, it } from "vitest";
import { humanText, opaqueId, unsafeTextProblem } from "../../../shared/schemas/text";

describe("humanText", () => {
  const name = humanText({ field: "Name", max: 10, min: 1 });
  const notes = humanText({ field: "Notes", max: 50, multiline: true });

  it.each([
    ["Dana", true],
    ["  Dana  ", true], // trimmed
    ["Zoë Åberg", true],
    ["日本語の名前", true],
    ["", false],
    ["A".repeat(11), false],
    ["Da\u0000na", false],
    ["Da\u001bna", false], // ESC
    ["Da\u0085na", false], // NEL, a C1 control
    ["Da\u007fna", false], // DEL
    ["Da\nna", false],
    ["Da\u202ena", false], // right-to-left override
    ["Da\u2067na", false], // right-to-left isolate
    ["Da\ud800na", false], // lone high surrogate
    ["😀 ok", true], // a proper surrogate pair
  ])("name %j → %s", (v, ok) => expect(name.safeParse(v).success).toBe(ok));

  it("lets notes keep line breaks and tabs, nothing else", () => {
    expect(notes.safeParse("line one\r\n\tline two").success).toBe(true);
    expect(notes.safeParse("line\u000bvertical tab").success).toBe(false);
  });

  it("names the field and the character in its message", () => {
    const r = name.safeParse("a\u0000b");
    expect(r.error?.issues[0]?.message).toBe("Name contains a control character (U+0000)");
    expect(unsafeTextProblem("x\u202dy")).toBe("contains a text-direction override character (U+202D)");
    expect(name.safeParse("A".repeat(11)).error?.issues[0]?.message).toBe("Name can be at most 10 characters");
  });
});

describe("opaqueId", () => {
  it.each([["QJ7xk2", true], ["", false], ["a b", false], ["a\u0000", false], ["x".repeat(101), false]])("%j → %s", (v, ok) =>
    expect(opaqueId("teamId").safeParse(v).success).toBe(ok),
  );
});
