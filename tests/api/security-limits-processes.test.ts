// Two web processes on one database count one sign-in limit together: attempts spread over both
// are stopped after RATE_LIMITS.signIn in all, not that many per process (decision 183).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, seedWorld } from "./helpers";
import { startWebProcess, type WebProcess } from "./web-process";
import { RATE_LIMITS } from "../../server/security/rate-limits";

let a: WebProcess | undefined;
let b: WebProcess | undefined;
beforeAll(async () => {
  await seedWorld();
  [a, b] = await Promise.all([startWebProcess("web-a", { RATE_LIMIT: "true" }), startWebProcess("web-b", { RATE_LIMIT: "true" })]);
}, 180_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
});

describe("sign-in limits across web processes", () => {
  it("attempts alternating between two processes are stopped after the limit in all", async () => {
    const clients = [new Client(a!.url), new Client(b!.url)];
    const statuses: number[] = [];
    for (let i = 0; i < RATE_LIMITS.signIn + 4; i++) {
      const r = await clients[i % 2]!.request("POST", "/api/auth/sign-in/email", { email: `nobody${i}@ravens.example`, password: `guess-number-${i}` });
      statuses.push(r.status);
    }
    expect(statuses.slice(0, RATE_LIMITS.signIn).every((s) => s === 401), JSON.stringify(statuses)).toBe(true);
    expect(statuses.slice(RATE_LIMITS.signIn)).toEqual([429, 429, 429, 429]);
    const refused = await clients[1]!.request("POST", "/api/auth/sign-in/email", { email: "nobody@ravens.example", password: "one-more-guess" });
    expect(refused.headers.get("ratelimit") ?? "").toMatch(/r=\d+/); // says when to try again
  });

  it("ended windows are removed by the sweep; open ones stay", async () => {
    const { db } = await import("../../server/db/client");
    const { removeEndedWindows } = await import("../../server/security/rate-limit-store");
    const count = async () => Number((await db().pool.query("select count(*) from rate_limit_hit")).rows[0].count);
    expect(await count()).toBeGreaterThan(0);
    expect(await removeEndedWindows()).toBe(0);
    await db().pool.query("update rate_limit_hit set reset_at = now() - interval '2 minutes'");
    expect(await removeEndedWindows()).toBeGreaterThan(0);
    expect(await count()).toBe(0);
  });
});
