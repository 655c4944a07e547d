// What every request passes in one layer (decision 196): the security headers and request id on
// every answer, refusals included; the API guards on any spelling of /api that Express routes;
// the closing log line at LOG_LEVEL=info with its fields, none above info.
import { describe, expect, it } from "vitest";
import { EMAILS, useWorld } from "./helpers";
import { startWebProcess } from "./web-process";

const w = useWorld(EMAILS.coach);

const evil = { origin: "http://evil.example", "sec-fetch-site": "cross-site", "content-type": "application/json" };

/** The protective headers and a request id, which every answer must carry. */
function expectEveryRequestHeaders(h: Headers, what: string) {
  expect(h.get("content-security-policy"), what).toMatch(/default-src 'self'/);
  expect(h.get("x-content-type-options"), what).toBe("nosniff");
  expect(h.get("x-frame-options"), what).toBe("SAMEORIGIN");
  expect(h.get("x-request-id"), what).toMatch(/^[\w-]{1,64}$/);
}

describe("every request", () => {
  it("carries the security headers and a request id on answers, refusals and errors alike", async () => {
    const answers: [string, Promise<{ status: number; headers: Headers }>, number][] = [
      ["health", fetch(`${w.srv.url}/api/health`), 200],
      ["a hot read", w.signedIn.get(`/api/teams/${w.world.teamId}/clips`), 200],
      ["signed out", fetch(`${w.srv.url}/api/teams/${w.world.teamId}/clips`), 401],
      ["no such API route", fetch(`${w.srv.url}/api/nothing-here`), 404],
      ["a control character", fetch(`${w.srv.url}/api/teams/%00/clips`), 400],
      ["a cross-site write", fetch(`${w.srv.url}/api/me/prefs`, { method: "PATCH", headers: evil, body: "{}" }), 403],
      ["malformed JSON", fetch(`${w.srv.url}/api/me/prefs`, { method: "PATCH", headers: { "content-type": "application/json" }, body: "{" }), 400],
      ["a page", fetch(`${w.srv.url}/`), -1],
    ];
    for (const [what, pending, status] of answers) {
      const r = await pending;
      if (status > 0) expect(r.status, what).toBe(status);
      expectEveryRequestHeaders(r.headers, what);
    }
  });

  it("keeps a proxy's request id and answers with it", async () => {
    const r = await fetch(`${w.srv.url}/api/health`, { headers: { "x-request-id": "proxy-id-42" } });
    expect(r.headers.get("x-request-id")).toBe("proxy-id-42");
    const replaced = await fetch(`${w.srv.url}/api/health`, { headers: { "x-request-id": "not valid!" } });
    expect(replaced.headers.get("x-request-id")).toMatch(/^[0-9a-f-]{36}$/);
  });

  it("guards /api in any letter case, as Express routes it", async () => {
    // Express matches paths without regard to case: /API/me/prefs reaches the same route.
    const write = await fetch(`${w.srv.url}/API/Me/prefs`, { method: "PATCH", headers: evil, body: JSON.stringify({ units: "imperial" }) });
    expect(write.status).toBe(403);
    expect((await write.json()).code).toBe("cross_site_request");
    const control = await fetch(`${w.srv.url}/Api/teams/x%1f/clips`);
    expect(control.status).toBe(400);
    expect((await control.json()).code).toBe("invalid_url");
    expect((await w.signedIn.get("/api/me")).json.prefs.units).toBe("metric");
  });
});

describe("the request log line", () => {
  it("is written at LOG_LEVEL=info with its fields, while the process runs and when it stops, and not at warn", async () => {
    const lines = async (level: string) => {
      const web = await startWebProcess(`log-${level}`, { LOG_LEVEL: level });
      const out: Record<string, unknown>[] = [];
      web.proc.stdout!.on("data", (chunk: string) => out.push(...chunk.split("\n").filter(Boolean).map((l) => JSON.parse(l) as Record<string, unknown>)));
      const lineOf = (id: string) => out.filter((l) => l.msg === "request" && l.reqId === id);
      const ask = async (id: string) => expect((await fetch(`${web.url}/api/nothing-here?secret=1`, { headers: { "x-request-id": id } })).status).toBe(404);
      // Request lines are written in batches (decision 197): one still comes out while the process
      // runs and nothing else is asked of it ...
      await ask(`log-running-${level}`);
      if (level === "info") await expect.poll(() => lineOf(`log-running-${level}`).length, { timeout: 10_000 }).toBe(1);
      // ... and the last one before the process stops is not lost.
      await ask(`log-last-${level}`);
      await web.stop();
      return [...lineOf(`log-running-${level}`), ...lineOf(`log-last-${level}`)];
    };
    const info = await lines("info");
    expect(info).toHaveLength(2);
    for (const [i, line] of info.entries()) {
      expect(line).toMatchObject({ level: 30, svc: "log-info", reqId: i ? "log-last-info" : "log-running-info", method: "GET", path: "/api/nothing-here", status: 404 });
      expect(typeof line.ms).toBe("number");
      expect(typeof line.time).toBe("number");
    }
    expect(await lines("warn")).toEqual([]);
  });
});
