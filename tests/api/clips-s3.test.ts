// The same ingest with the S3-compatible storage (s3rver on loopback): the original, frames,
// strip and thumbnail land in the bucket, are served from it (frames, byte ranges), and a delete
// empties the clip's prefix. Nothing but unfinished uploads and job folders touches local disk.
import { clipMeta, makeClip, tusUpload, uploadDir, waitFor } from "./clips-support";
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { startFakeS3 } from "../unit/storage/fake-s3";
import { setStorageForTests } from "../../server/clips/deps";
import { startJobs, stopJobs } from "../../server/jobs/runtime";

let srv: TestServer;
let world: Awaited<ReturnType<typeof seedWorld>>;
let coach: Client;
let s3: Awaited<ReturnType<typeof startFakeS3>>;

beforeAll(async () => {
  s3 = await startFakeS3("loadframe-clips");
  setStorageForTests(s3.storage());
  srv = await startServer();
  world = await seedWorld();
  await startJobs({ work: true });
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(async () => {
  await stopJobs();
  await srv.close();
  setStorageForTests(undefined);
  await s3.stop();
});

describe("clip ingest on S3-compatible storage", () => {
  it("stores, extracts, serves and deletes through the bucket", async () => {
    const file = makeClip("s3.mp4", { frames: 24, size: "320x180" });
    const r = await tusUpload(srv.url, coach, file, { teamId: world.teamId, filename: "s3.mp4", meta: JSON.stringify(clipMeta({ playerId: world.users[EMAILS.player] })) });
    expect(r.ok, JSON.stringify(r.body)).toBe(true);
    const id = r.body.clip.id as string;
    const team = `/api/teams/${world.teamId}`;
    await waitFor("ready", async () => {
      const c = (await coach.get(`${team}/clips/${id}`)).json;
      if (c.status === "failed") throw new Error(c.failureReason);
      return c.status === "ready";
    });

    const keys = (await s3.storage().list(`clips/${id}/`)).map((o) => o.key.slice(`clips/${id}/`.length));
    expect(keys).toEqual(expect.arrayContaining(["original", "strip.jpg", "thumb.jpg", "frames/000001.jpg", "frames/000024.jpg"]));
    expect(keys.filter((k) => k.startsWith("frames/"))).toHaveLength(24);
    expect(existsSync(path.join(uploadDir, "clips"))).toBe(false);

    const frame = await coach.get(`${team}/clips/${id}/frames/24`);
    expect(frame.status).toBe(200);
    expect(frame.headers.get("content-type")).toBe("image/jpeg");
    const whole = readFileSync(file);
    const part = await coach.request("GET", `${team}/clips/${id}/original`, undefined, { headers: { range: "bytes=100-163" } });
    expect(part.status).toBe(206);
    expect(part.headers.get("content-range")).toBe(`bytes 100-163/${whole.length}`);

    expect((await coach.del(`${team}/clips/${id}`)).status).toBe(204);
    expect(await s3.storage().list(`clips/${id}/`)).toEqual([]);
  });
});
