// A local S3-compatible fake (s3rver) on a free loopback port, for the S3Storage tests.
import S3rver from "s3rver";
import { S3Storage, type S3StorageOptions } from "../../../server/storage";
import { tempDir } from "../media/helpers";

export const fakeCredentials = { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" };

export async function startFakeS3(bucket = "loadframe-test") {
  const { dir, cleanup } = await tempDir("s3rver");
  const server = new S3rver({ address: "127.0.0.1", port: 0, silent: true, directory: dir, configureBuckets: [{ name: bucket }] });
  const { port } = await server.run();
  const endpoint = `http://127.0.0.1:${port}`;
  const storage = (extra: Partial<S3StorageOptions> = {}) =>
    new S3Storage({ bucket, endpoint, credentials: fakeCredentials, ...extra });
  return {
    endpoint,
    bucket,
    storage,
    stop: async () => {
      await server.close();
      await cleanup();
    },
  };
}
