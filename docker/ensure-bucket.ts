// Creates the S3 bucket named in S3_BUCKET when it does not exist yet (idempotent). Run once by
// the compose "setup" service before the app and the workers start.
import { CreateBucketCommand, HeadBucketCommand, S3Client } from "@aws-sdk/client-s3";

const e = process.env;
if (e.STORAGE !== "s3") process.exit(0);
const client = new S3Client({
  endpoint: e.S3_ENDPOINT,
  region: e.S3_REGION ?? "us-east-1",
  forcePathStyle: Boolean(e.S3_ENDPOINT),
  credentials: e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY } : undefined,
});
const Bucket = e.S3_BUCKET ?? "loadframe";
for (let attempt = 1; ; attempt++) {
  try {
    await client.send(new HeadBucketCommand({ Bucket }));
    console.log(`bucket ${Bucket} is there`);
    break;
  } catch (err) {
    const status = (err as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
    if (status === 404) {
      await client.send(new CreateBucketCommand({ Bucket }));
      console.log(`bucket ${Bucket} created`);
      break;
    }
    if (attempt >= 30) throw err;
    await new Promise((r) => setTimeout(r, 1000)); // the object store is still starting
  }
}
