import { describe, expect, it } from "vitest";
import { captureTimes, ClipMetaSchema, needsCaptureRateConfirmation } from "../../../shared/schemas/clips";
import { decideCaptureRate } from "../../../server/clips/ingest";

describe("capture rate vs stored rate", () => {
  it("a stored rate of 60 fps or less asks for confirmation; above it is believed [CP]", () => {
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 30 })).toEqual({ captureFps: 30, captureFpsConfirmed: false });
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 60 })).toEqual({ captureFps: 60, captureFpsConfirmed: false });
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 240 })).toEqual({ captureFps: 240, captureFpsConfirmed: true });
    expect(decideCaptureRate({ captureFps: 3200, captureFpsConfirmed: true }, { storedFps: 30 })).toEqual({ captureFps: 3200, captureFpsConfirmed: true });
    // A typed rate without the tick is kept but not confirmed.
    expect(decideCaptureRate({ captureFps: 3200, captureFpsConfirmed: false }, { storedFps: 30 })).toEqual({ captureFps: 3200, captureFpsConfirmed: false });
    // No rate in the file at all: a placeholder the person must replace.
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 0 })).toEqual({ captureFps: 30, captureFpsConfirmed: false });
  });

  it("a phone's capture-rate tag pre-fills the rate; the uneven clock's typical rate is never confirmed by itself (issue 15)", () => {
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 30, taggedCaptureFps: 240 })).toEqual({ captureFps: 240, captureFpsConfirmed: false });
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 240, taggedCaptureFps: 240 })).toEqual({ captureFps: 240, captureFpsConfirmed: true });
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 240, clock: "uneven" })).toEqual({ captureFps: 240, captureFpsConfirmed: false });
    expect(decideCaptureRate({ captureFpsConfirmed: false }, { storedFps: 1200, clock: "snapped" })).toEqual({ captureFps: 1200, captureFpsConfirmed: true });
    expect(needsCaptureRateConfirmation({ storedFps: 240, captureFpsConfirmed: false })).toBe(true);
  });

  it("flags only unconfirmed playback-looking rates", () => {
    expect(needsCaptureRateConfirmation({ storedFps: 30, captureFpsConfirmed: false })).toBe(true);
    expect(needsCaptureRateConfirmation({ storedFps: 30, captureFpsConfirmed: true })).toBe(false);
    expect(needsCaptureRateConfirmation({ storedFps: null, captureFpsConfirmed: false })).toBe(true);
  });

  it("capture times: a 3,200 fps capture stored at 30 fps is 1/3200 s per frame [M]", () => {
    const stored = [0, 1 / 30, 2 / 30, 3 / 30];
    const t = captureTimes(stored, 30, 3200);
    t.forEach((v, i) => expect(v).toBeCloseTo(i / 3200, 12));
    // Real-time phone clip (stored rate = capture rate): timestamps unchanged, also when uneven.
    expect(captureTimes([0.5, 0.504, 0.5125], 240, 240)).toEqual([0, 0.504 - 0.5, 0.5125 - 0.5]);
  });
});

describe("clip details schema", () => {
  const ok = { playerId: "u1", shotType: "slap", cameraView: "side", newSession: { date: "2026-03-14" } };
  it("accepts a minimal form and fills defaults", () => {
    const r = ClipMetaSchema.parse(ok);
    expect(r).toMatchObject({ title: "", notes: "", captureFpsConfirmed: false, newSession: { venue: "", drill: "" } });
  });
  it("names each bad field", () => {
    const r = ClipMetaSchema.safeParse({ ...ok, newSession: undefined, shotType: "chip", captureFps: -1, captureFpsConfirmed: true, extra: 1 });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join(".") || i.code);
    expect(paths).toEqual(expect.arrayContaining(["shotType", "captureFps", "unrecognized_keys"]));
  });
  it("needs a session, existing or new, not both", () => {
    const none = ClipMetaSchema.safeParse({ ...ok, newSession: undefined });
    expect(none.error?.issues[0]).toMatchObject({ path: ["sessionId"], message: "Pick a session or enter the date of a new one" });
    const both = ClipMetaSchema.safeParse({ ...ok, sessionId: "3f2b1c9e-8a2b-4c1d-9e7f-0a1b2c3d4e5f" });
    expect(both.error?.issues[0].path).toEqual(["newSession"]);
  });
});
