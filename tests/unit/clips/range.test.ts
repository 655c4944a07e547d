import { describe, expect, it } from "vitest";
import { parseRange, videoMime } from "../../../server/clips/serve";

// Byte ranges as RFC 9110 §14.1.2 defines them (worked examples in that section).
describe("parseRange", () => {
  const size = 10_000;
  it("first 500 bytes, second 500, suffix, open end", () => {
    expect(parseRange("bytes=0-499", size)).toEqual({ start: 0, end: 499 });
    expect(parseRange("bytes=500-999", size)).toEqual({ start: 500, end: 999 });
    expect(parseRange("bytes=-500", size)).toEqual({ start: 9500, end: 9999 });
    expect(parseRange("bytes=9500-", size)).toEqual({ start: 9500, end: 9999 });
  });
  it("clamps an end past the object; a suffix longer than the object is all of it", () => {
    expect(parseRange("bytes=9000-20000", size)).toEqual({ start: 9000, end: 9999 });
    expect(parseRange("bytes=-20000", size)).toEqual({ start: 0, end: 9999 });
  });
  it("unsatisfiable: starts past the end, or an empty suffix", () => {
    expect(parseRange("bytes=10000-", size)).toBe("unsatisfiable");
    expect(parseRange("bytes=-0", size)).toBe("unsatisfiable");
    expect(parseRange("bytes=700-600", size)).toBe("unsatisfiable");
  });
  it("no header, other units or several ranges: the whole object", () => {
    expect(parseRange(undefined, size)).toBeNull();
    expect(parseRange("items=0-1", size)).toBeNull();
    expect(parseRange("bytes=0-1,5-6", size)).toBeNull();
  });
});

describe("videoMime", () => {
  it("maps ffprobe's container names", () => {
    expect(videoMime("mov,mp4,m4a,3gp,3g2,mj2")).toBe("video/mp4");
    expect(videoMime("matroska,webm")).toBe("video/webm");
    expect(videoMime("avi")).toBe("video/x-msvideo");
    expect(videoMime(undefined)).toBe("application/octet-stream");
  });
});
