import { describe, expect, it } from "vitest";
import { extractionShare, extractionView } from "../../../src/features/clips/model/extraction";
import type { ClipProgress } from "../../../shared/schemas/clips";

// The upload item and the Clip page merge the stored clip with the progress stream. The stream is
// closed the moment the stored clip refetches as no longer extracting, so its last event may be
// stale; these cases are the races seen in the browser suite (bar stuck at 194 of 240, or at
// 100 % without "All frames ready").
const stored = (status: ClipProgress["status"], framesDone: number) => ({ status, framesDone, frameCount: 240, failureReason: status === "failed" ? "ffmpeg stopped" : null });
const event = (status: ClipProgress["status"], framesDone: number): ClipProgress => ({ id: "c", status, framesDone, frameCount: 240, progress: framesDone / 240, failureReason: null });

describe("extractionView", () => {
  it("the stored clip's ready wins over a stream closed at 194 of 240", () => {
    const v = extractionView(stored("ready", 240), event("extracting", 194));
    expect(v.status).toBe("ready");
    expect(extractionShare(v)).toBe(1);
  });
  it("the stored clip's ready wins over a last event of 240 of 240 still extracting (the strip being made)", () => {
    expect(extractionView(stored("ready", 240), event("extracting", 240)).status).toBe("ready");
  });
  it("a failure stored after the stream closed shows with the stored reason", () => {
    const v = extractionView(stored("failed", 100), event("extracting", 90));
    expect(v).toMatchObject({ status: "failed", failureReason: "ffmpeg stopped" });
  });
  it("while the stored clip is extracting the stream leads, including its final ready", () => {
    expect(extractionView(stored("extracting", 10), event("extracting", 120))).toMatchObject({ status: "extracting", framesDone: 120 });
    expect(extractionView(stored("extracting", 10), event("ready", 240)).status).toBe("ready");
  });
  it("a stream event older than the stored count does not move the bar backwards", () => {
    expect(extractionView(stored("extracting", 200), event("extracting", 150)).framesDone).toBe(200);
  });
  it("no stream yet: the stored clip as it is", () => {
    expect(extractionView(stored("extracting", 30), null)).toMatchObject({ status: "extracting", framesDone: 30 });
    expect(extractionShare(extractionView(stored("extracting", 60), null))).toBe(0.25);
  });
});
