// Uploads are never executed nor served with a type a browser could sniff into HTML or script:
// a page or an SVG named .mp4 is refused before anything is stored; stored media come back with
// an explicit type, nosniff and our CSP; the upload folder itself is not served. The request id
// of the upload travels into the extraction job.
import { clipMeta, cookieOf, makeClip, storedClipDirs, tusLeftovers, tusUpload, uploadDir } from "./clips-support";
import { writeFileSync } from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";
import { extractClip } from "../../server/jobs/clip-extract";
import { db } from "../../server/db/client";
import { log } from "../../server/log";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
let clipId = "";

beforeAll(async () => {
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: false }); // jobs are queued, and run below in this process
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
});

const team = () => `/api/teams/${world.teamId}`;
const meta = () => JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] }));

describe("hostile uploads", () => {
  it.each([
    ["page.mp4", "<!doctype html><html><body><script>fetch('/api/me')</script></body></html>\n"],
    ["image.mp4", `<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(2)</script></svg>\n`],
    ["run.mp4", "#!/bin/sh\necho owned > /tmp/owned\n"],
  ])("refuses %s (not video) and stores nothing", async (name, body) => {
    const f = path.join(uploadDir, `..${path.sep}${path.basename(uploadDir)}-${name}`);
    writeFileSync(f, body.repeat(40));
    const before = storedClipDirs().length;
    const r = await tusUpload(srv.url, coach, f, { teamId: world.teamId, filename: name, meta: meta() });
    expect(r.ok).toBe(false);
    expect(r.status).toBe(422);
    expect(r.body.code).toBe("not_media");
    expect(storedClipDirs()).toHaveLength(before);
    expect(tusLeftovers()).toEqual([]);
  });
});

describe("stored media over HTTP", () => {
  beforeAll(async () => {
    const file = makeClip("served.mp4", { frames: 12, size: "160x90" });
    // A proxy's X-Request-Id is kept (server/log.ts), so one id follows the upload into its job.
    const headers = { cookie: cookieOf(coach), origin: "http://127.0.0.1:3000", "x-request-id": "upload-7f3a-test" };
    const r = await tusUpload(srv.url, coach, file, { teamId: world.teamId, filename: "<script>x</script>.html", meta: meta() }, { headers });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    clipId = r.body.clip.id;
    expect(await extractClip(clipId, { log, lastAttempt: true })).toBe("ready");
  });

  it("carries the upload's request id into the extraction job", async () => {
    expect((await jobOf(clipId))?.reqId).toBe("upload-7f3a-test");
    // Without a proxy's id the server makes one (a UUID) and the job carries that.
    const file = makeClip("no-id.mp4", { frames: 6, size: "160x90" });
    const r = await tusUpload(srv.url, coach, file, { teamId: world.teamId, filename: "no-id.mp4", meta: meta() });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    expect((await jobOf(r.body.clip.id))?.reqId).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/);
  });

  it("serves frames, thumbnail, strip and original with an explicit type and nosniff", async () => {
    const want: [string, RegExp][] = [
      ["frames/1", /^image\/jpeg$/],
      ["thumbnail", /^image\/jpeg$/],
      ["strip", /^image\/jpeg$/],
      ["original", /^video\/mp4$/],
    ];
    for (const [p, type] of want) {
      const r = await coach.get(`${team()}/clips/${clipId}/${p}`);
      expect(r.status, p).toBe(200);
      expect(r.headers.get("content-type"), p).toMatch(type);
      expect(r.headers.get("x-content-type-options"), p).toBe("nosniff");
      expect(r.headers.get("content-security-policy"), p).toMatch(/default-src 'self'/);
    }
    // The client's file name is only a label: quoted, never a path or markup in a header.
    const original = await coach.get(`${team()}/clips/${clipId}/original`);
    expect(original.headers.get("content-disposition")).toMatch(/^inline; filename="[^"\\\r\n]*"; filename\*=UTF-8''[^\s"]+$/);
  });

  it("does not serve the upload folder as static files", async () => {
    for (const p of [`/uploads/clips/${clipId}/original`, `/clips/${clipId}/original`, `/api/uploads/${clipId}`]) {
      const r = await coach.get(p);
      expect(r.headers.get("content-type") ?? "", p).not.toMatch(/^video\//);
      expect(r.text.startsWith("\u0000\u0000\u0000"), p).toBe(false); // no MP4 box header came back
    }
  });
});

async function jobOf(id: string) {
  const jobs = await db().execute<{ data: { clipId: string; reqId?: string } }>(sql`select data from pgboss.job where name = 'clip.extract'`);
  return jobs.rows.find((j) => j.data.clipId === id)?.data;
}
