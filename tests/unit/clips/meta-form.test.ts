import { describe, expect, it } from "vitest";
import { emptyMeta, errorsFrom, fromMeta, validateMeta } from "../../../src/features/clips/upload/metaForm";
import { classifyUploadError } from "../../../src/features/clips/upload/clipUpload";

describe("the upload form on the shared schema", () => {
  it("puts each problem next to its field, new-session parts included", () => {
    const r = validateMeta({ ...emptyMeta(), newDate: "14/03/2026", captureFps: "fast" });
    expect(r.errors).toMatchObject({ playerId: expect.any(String), shotType: expect.any(String), newDate: "Use a date like 2026-03-14", captureFps: expect.any(String) });
  });
  it("turns typed strings into the clip details and back", () => {
    const r = validateMeta({ ...emptyMeta(), playerId: "u1", shotType: "wrist", newDate: "2026-03-14", captureFps: "3,200", captureFpsConfirmed: true, exposureUs: "100" });
    expect(r.meta).toMatchObject({ playerId: "u1", shotType: "wrist", captureFps: 3200, captureFpsConfirmed: true, exposureUs: 100, newSession: { date: "2026-03-14" } });
    expect(fromMeta(r.meta!)).toMatchObject({ captureFps: "3200", captureFpsConfirmed: true, session: "new", newDate: "2026-03-14" });
  });
  it("a confirmation without a rate is not a confirmation", () => {
    const r = validateMeta({ ...emptyMeta(), playerId: "u1", shotType: "slap", captureFpsConfirmed: true });
    expect(r.meta?.captureFpsConfirmed).toBe(false);
  });
  it("an image sequence needs its rate typed, and typing it confirms it", () => {
    const base = { ...emptyMeta(), playerId: "u1", shotType: "slap" as const };
    expect(validateMeta(base, { sequence: true }).errors?.captureFps).toMatch(/rate the camera recorded at/);
    expect(validateMeta({ ...base, captureFps: "5000" }, { sequence: true }).meta).toMatchObject({ captureFps: 5000, captureFpsConfirmed: true });
    expect(validateMeta(base).meta?.captureFps).toBeUndefined();
  });
  it("a sequence's refusals are unusable files; its missing rate goes to the rate field", () => {
    const res = (status: number, body: unknown) => ({ originalResponse: { getStatus: () => status, getBody: () => JSON.stringify(body) } });
    expect(classifyUploadError(res(422, { code: "sequence_gap", detail: "r_2.png is followed by r_5.png" }))).toMatchObject({ kind: "invalid_file", message: "r_2.png is followed by r_5.png" });
    const rate = classifyUploadError(res(422, { code: "sequence_rate_missing", detail: "x", errors: [{ path: "captureFps", message: "Type the rate" }] }));
    expect(rate.kind).toBe("invalid_details");
    expect(errorsFrom(rate.fields)).toEqual({ captureFps: "Type the rate" });
  });
  it("maps server field paths to form fields", () => {
    expect(errorsFrom([{ path: "sessionId", message: "x" }, { path: "newSession.venue", message: "y" }])).toEqual({ session: "x", newVenue: "y" });
  });
});

describe("upload failures as a person reads them", () => {
  const res = (status: number, body: unknown) => ({ originalResponse: { getStatus: () => status, getBody: () => (typeof body === "string" ? body : JSON.stringify(body)) } });
  it("no response at all is a network abort, not 'too large'", () => {
    expect(classifyUploadError(new Error("socket hang up")).kind).toBe("network");
    expect(classifyUploadError({ originalResponse: null }).kind).toBe("network");
  });
  it("too large, over quota, duplicate and unusable files each keep their own kind", () => {
    expect(classifyUploadError(res(413, { code: "too_large", detail: "The file is 5.00 GB" }))).toMatchObject({ kind: "too_large", message: "The file is 5.00 GB" });
    expect(classifyUploadError(res(413, "<html>proxy says no</html>"))).toMatchObject({ kind: "too_large", code: "too_large" });
    expect(classifyUploadError(res(413, { code: "quota_exceeded", detail: "q" })).kind).toBe("quota");
    expect(classifyUploadError(res(409, { code: "duplicate_clip", detail: "d", existingClipId: "c1" }))).toMatchObject({ kind: "duplicate", existingClipId: "c1" });
    expect(classifyUploadError(res(422, { code: "truncated_file", detail: "t" })).kind).toBe("invalid_file");
    expect(classifyUploadError(res(422, { code: "validation_failed", detail: "v", errors: [{ path: "playerId", message: "m" }] })).fields).toHaveLength(1);
  });
});
