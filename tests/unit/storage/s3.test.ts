// S3Storage specifics against the local fake: refused credentials, a missing bucket, key prefixes.
import { Readable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { StorageError } from "../../../server/storage";
import { startFakeS3 } from "./fake-s3";

let s3: Awaited<ReturnType<typeof startFakeS3>>;
beforeAll(async () => (s3 = await startFakeS3()));
afterAll(() => s3.stop());

const body = () => Readable.from([Buffer.from("x")]);

describe("S3Storage", () => {
  it("reports refused credentials as unwritable, naming the bucket", async () => {
    const storage = s3.storage({ credentials: { accessKeyId: "NOT-A-KEY", secretAccessKey: "wrong" } });
    const err = await storage.putStream("a/b", body()).catch((e) => e);
    expect(err).toBeInstanceOf(StorageError);
    expect(err.code).toBe("unwritable");
    expect(err.message).toContain(s3.bucket);
  });

  it("reports a missing bucket", async () => {
    const err = await s3.storage({ bucket: "no-such-bucket" }).putStream("a/b", body()).catch((e) => e);
    expect(err).toBeInstanceOf(StorageError);
    expect(err.code).toBe("io_error");
    expect(err.message).toMatch(/no-such-bucket does not exist/);
  });

  it("keeps a key prefix invisible to callers and apart from other prefixes", async () => {
    const a = s3.storage({ keyPrefix: "site-a/" });
    const b = s3.storage({ keyPrefix: "site-b/" });
    await a.putStream("clips/c1/original", body());
    expect((await a.list("clips/")).map((o) => o.key)).toEqual(["clips/c1/original"]);
    expect(await b.exists("clips/c1/original")).toBe(false);
    expect(await s3.storage().exists("site-a/clips/c1/original")).toBe(true);
    expect(a.localPath()).toBeNull();
  });
});
