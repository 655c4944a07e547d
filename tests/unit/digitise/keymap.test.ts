// The key map: one table for the handler and the help overlay; no key does two things.
import { describe, expect, it } from "vitest";
import { bindings, commandFor, isTypingTarget, type KeyLike } from "@/features/digitise/model/keymap";

const probes: KeyLike[] = [];
for (const key of ["ArrowLeft", "ArrowRight", "Home", "End", " ", "Delete", "Backspace", "Escape", "[", "]", ",", ".", "+", "=", "-", "?", ..."abcdefghijklmnopqrstuvwxyz", ..."123456"])
  for (const shiftKey of [false, true]) for (const ctrlKey of [false, true]) probes.push({ key: shiftKey && key.length === 1 ? key.toUpperCase() : key, code: /\d/.test(key) ? `Digit${key}` : undefined, shiftKey, ctrlKey });

describe("key map", () => {
  it("every key press matches at most one binding", () => {
    for (const p of probes) expect(bindings.filter((b) => b.match(p)).length, JSON.stringify(p)).toBeLessThanOrEqual(1);
  });
  it("every binding is reachable and described", () => {
    for (const b of bindings) {
      expect(b.description.length).toBeGreaterThan(5);
      expect(probes.some((p) => b.match(p)), b.command).toBe(true);
    }
    expect(new Set(bindings.map((b) => b.command)).size).toBe(bindings.length);
  });
  it("stepping, events and undo", () => {
    expect(commandFor({ key: "ArrowRight" })).toBe("next");
    expect(commandFor({ key: "ArrowLeft", shiftKey: true })).toBe("prev10");
    expect(commandFor({ key: "p" })).toBe("event:puckStrike");
    expect(commandFor({ key: "P", shiftKey: true })).toBe("gotoEvent:puckStrike");
    expect(commandFor({ key: "z", ctrlKey: true })).toBe("undo");
    expect(commandFor({ key: "Z", metaKey: true, shiftKey: true })).toBe("redo");
    expect(commandFor({ key: "3", code: "Digit3" })).toBe("landmark:bladeToe");
  });
  it("read-only shots answer viewing keys only", () => {
    expect(commandFor({ key: "ArrowRight" }, true)).toBe("next");
    expect(commandFor({ key: "r" }, true)).toBeNull();
    expect(commandFor({ key: "Delete" }, true)).toBeNull();
    expect(commandFor({ key: "z", ctrlKey: true }, true)).toBeNull();
  });
  it("keys typed into a field are left alone", () => {
    expect(isTypingTarget({ tagName: "INPUT", type: "number" })).toBe(true);
    expect(isTypingTarget({ tagName: "INPUT", type: "checkbox" })).toBe(false);
    expect(isTypingTarget({ tagName: "DIV" })).toBe(false);
  });
});
