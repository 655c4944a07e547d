// Keys come from ids only; a client's file name is at most a display label.
import { describe, expect, it } from "vitest";
import { clipKeys, displayFileName, frameIndexOf, StorageError, validateKey } from "../../../server/storage";

const clipId = "3f2b8c1e-5d4a-4e7b-9c2a-1b2c3d4e5f60";

describe("clip keys", () => {
  it("follow the documented layout", () => {
    expect(clipKeys.original(clipId)).toBe(`clips/${clipId}/original`);
    expect(clipKeys.frame(clipId, 1, "jpg")).toBe(`clips/${clipId}/frames/000001.jpg`);
    expect(clipKeys.frame(clipId, 1_000_000, "webp")).toBe(`clips/${clipId}/frames/1000000.webp`);
    expect(clipKeys.strip(clipId)).toBe(`clips/${clipId}/strip.jpg`);
    expect(clipKeys.prefix(clipId)).toBe(`clips/${clipId}/`);
    for (const k of [clipKeys.original(clipId), clipKeys.frame(clipId, 7, "jpg"), clipKeys.strip(clipId)]) expect(validateKey(k)).toBe(k);
  });

  it("refuse anything but an id, so a client file name can never become a key", () => {
    const hostile = ["../../etc/passwd", "shot 1.mp4", "a/b", "clip\u0000.mp4", "clip\r\n.mp4", "", "x".repeat(65)];
    for (const name of hostile) expect(() => clipKeys.original(name)).toThrow(StorageError);
    expect(() => clipKeys.frame(clipId, 0, "jpg")).toThrow(/1 or more/);
  });

  it("give frame indexes back", () => {
    expect(frameIndexOf(clipKeys.frame(clipId, 42, "jpg"))).toBe(42);
    expect(frameIndexOf(clipKeys.strip(clipId))).toBeNull();
  });
});

describe("displayFileName", () => {
  it("drops folders, control and bidirectional-override characters", () => {
    expect(displayFileName("../../etc/passwd\u0000\r\n\u202Eevil.mp4")).toBe("passwdevil.mp4");
    expect(displayFileName("C:\\Users\\coach\\Slap shot  02.MOV")).toBe("Slap shot 02.MOV");
    expect(displayFileName("..")).toBe("clip");
    expect(displayFileName("\u0007")).toBe("clip");
    expect(displayFileName("a".repeat(500))).toHaveLength(200);
  });
});
