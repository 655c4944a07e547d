// The cross-site write decision as a table. Header meanings: W3C Fetch Metadata Request Headers
// (Sec-Fetch-Site values same-origin / same-site / cross-site / none) and RFC 6454 (Origin).
import { describe, expect, it } from "vitest";
import { judgeWrite } from "../../../server/security/same-origin";

const trusted = new Set(["http://127.0.0.1:3000", "http://localhost:5173"]);
const base = { host: "app.club.example", protocol: "https" };

const rows: [string, Parameters<typeof judgeWrite>[0], "allow" | "refuse"][] = [
  ["a read, whatever its origin", { ...base, method: "GET", origin: "https://evil.example", secFetchSite: "cross-site" }, "allow"],
  ["same-origin fetch", { ...base, method: "POST", origin: "https://app.club.example", secFetchSite: "same-origin" }, "allow"],
  ["typed-in navigation (user-initiated)", { ...base, method: "POST", secFetchSite: "none" }, "allow"],
  ["cross-site fetch", { ...base, method: "POST", origin: "https://evil.example", secFetchSite: "cross-site" }, "refuse"],
  ["sibling subdomain (same-site)", { ...base, method: "DELETE", origin: "https://other.club.example", secFetchSite: "same-site" }, "refuse"],
  ["trusted dev origin, same-site", { ...base, method: "PATCH", origin: "http://localhost:5173", secFetchSite: "same-site" }, "allow"],
  ["no Fetch Metadata, Origin = host", { ...base, method: "POST", origin: "https://app.club.example" }, "allow"],
  ["no Fetch Metadata, other Origin", { ...base, method: "POST", origin: "https://evil.example" }, "refuse"],
  ["no Fetch Metadata, other scheme", { ...base, method: "POST", origin: "http://app.club.example" }, "refuse"],
  ["opaque origin (sandboxed frame)", { ...base, method: "POST", origin: "null" }, "refuse"],
  ["no headers at all (script, curl)", { ...base, method: "PUT" }, "allow"],
  ["cross-site without Origin", { ...base, method: "POST", secFetchSite: "cross-site" }, "refuse"],
  ["malformed Origin", { ...base, method: "POST", origin: "not a url" }, "refuse"],
];

describe("judgeWrite", () => {
  it.each(rows)("%s", (_name, h, want) => {
    expect(judgeWrite(h, trusted)).toBe(want);
  });
});
