// Objects in an S3-compatible bucket. An object only becomes visible when PutObject or
// CompleteMultipartUpload succeeds, so nothing half-stored is ever listed; a failed multipart
// upload is aborted so its parts do not linger.
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  UploadPartCommand,
} from "@aws-sdk/client-s3";
import { createReadStream } from "node:fs";
import { stat, unlink } from "node:fs/promises";
import { Readable } from "node:stream";
import { pipeline } from "node:stream";
import { HashingStream } from "./hash";
import { validateKey, validatePrefix } from "./keys";
import {
  resolveRange,
  StorageError,
  type ByteRange,
  type GetResult,
  type PutFileOptions,
  type PutOptions,
  type PutResult,
  type Storage,
  type StoredObject,
} from "./types";

export interface S3StorageOptions {
  bucket: string;
  endpoint?: string;
  region?: string;
  /** Needed by most self-hosted S3-compatible servers. Default true when an endpoint is given. */
  forcePathStyle?: boolean;
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** Prepended to every key, to share a bucket. Must end with "/" when set. */
  keyPrefix?: string;
  /** Multipart part size; streams shorter than one part use a single PutObject. Default 8 MiB. */
  partSizeBytes?: number;
  client?: S3Client;
}

type SdkError = { name?: string; $metadata?: { httpStatusCode?: number }; message?: string };
const statusOf = (err: unknown) => (err as SdkError)?.$metadata?.httpStatusCode;
const isNotFound = (err: unknown) =>
  statusOf(err) === 404 || ["NoSuchKey", "NotFound"].includes((err as SdkError)?.name ?? "");

export class S3Storage implements Storage {
  readonly kind = "s3" as const;
  readonly client: S3Client;
  readonly bucket: string;
  private readonly keyPrefix: string;
  private readonly partSize: number;

  constructor(opts: S3StorageOptions) {
    this.bucket = opts.bucket;
    this.keyPrefix = opts.keyPrefix ? validatePrefix(opts.keyPrefix) : "";
    this.partSize = Math.max(5 * 1024 * 1024, opts.partSizeBytes ?? 8 * 1024 * 1024);
    this.client =
      opts.client ??
      new S3Client({
        endpoint: opts.endpoint,
        region: opts.region ?? "us-east-1",
        forcePathStyle: opts.forcePathStyle ?? Boolean(opts.endpoint),
        credentials: opts.credentials,
        // Without these, streamed bodies are sent with aws-chunked framing, which some
        // S3-compatible servers store verbatim (see ../shared/design/STACK.md).
        requestChecksumCalculation: "WHEN_REQUIRED",
        responseChecksumValidation: "WHEN_REQUIRED",
      });
  }

  private full(key: string) {
    return this.keyPrefix + validateKey(key);
  }

  private wrap(err: unknown, key: string): StorageError {
    if (err instanceof StorageError) return err;
    const e = err as SdkError;
    if (isNotFound(err) && e.name !== "NoSuchBucket") return new StorageError("not_found", `No object ${key}`, { key }, { cause: err });
    if (statusOf(err) === 403) {
      return new StorageError("unwritable", `Bucket ${this.bucket} refused access (${e.name}); check the credentials and bucket policy.`, { key }, { cause: err });
    }
    if (e.name === "NoSuchBucket") {
      return new StorageError("io_error", `Bucket ${this.bucket} does not exist`, { key }, { cause: err });
    }
    return new StorageError("io_error", `Object storage error on ${key}: ${e.name ?? ""} ${e.message ?? String(err)}`.trim(), { key }, { cause: err });
  }

  async putStream(key: string, body: Readable, opts: PutOptions = {}): Promise<PutResult> {
    const Key = this.full(key);
    const counter = new HashingStream({ hash: opts.hash === true, maxBytes: opts.maxBytes });
    pipeline(body, counter, () => undefined); // errors surface through the iteration below
    let uploadId: string | undefined;
    const parts: { ETag: string; PartNumber: number }[] = [];
    let pending: Buffer[] = [];
    let pendingBytes = 0;
    const flushPart = async () => {
      const chunk = Buffer.concat(pending);
      pending = [];
      pendingBytes = 0;
      if (!uploadId) {
        const created = await this.client.send(
          new CreateMultipartUploadCommand({ Bucket: this.bucket, Key, ContentType: opts.contentType }),
        );
        uploadId = created.UploadId!;
      }
      const PartNumber = parts.length + 1;
      const r = await this.client.send(
        new UploadPartCommand({ Bucket: this.bucket, Key, UploadId: uploadId, PartNumber, Body: chunk, ContentLength: chunk.length }),
      );
      parts.push({ ETag: r.ETag!, PartNumber });
    };
    try {
      for await (const chunk of counter) {
        pending.push(chunk as Buffer);
        pendingBytes += (chunk as Buffer).length;
        if (pendingBytes >= this.partSize) await flushPart();
      }
      if (!uploadId) {
        const all = Buffer.concat(pending);
        await this.client.send(
          new PutObjectCommand({ Bucket: this.bucket, Key, Body: all, ContentLength: all.length, ContentType: opts.contentType }),
        );
      } else {
        if (pendingBytes > 0) await flushPart();
        await this.client.send(
          new CompleteMultipartUploadCommand({ Bucket: this.bucket, Key, UploadId: uploadId, MultipartUpload: { Parts: parts } }),
        );
      }
      return { key, size: counter.bytes, ...(opts.hash ? { sha256: counter.sha256 } : {}) };
    } catch (err) {
      body.destroy();
      if (uploadId) {
        await this.client
          .send(new AbortMultipartUploadCommand({ Bucket: this.bucket, Key, UploadId: uploadId }))
          .catch(() => undefined);
      }
      throw this.wrap(err, key);
    }
  }

  async putFile(key: string, file: string, opts: PutFileOptions = {}): Promise<PutResult> {
    let size: number;
    try {
      size = (await stat(file)).size;
    } catch (err) {
      throw new StorageError("io_error", `Cannot read ${file}: ${(err as Error).message}`, { key }, { cause: err });
    }
    if (opts.maxBytes !== undefined && size > opts.maxBytes) {
      throw new StorageError("too_large", `More than ${opts.maxBytes} bytes`, { maxBytes: opts.maxBytes });
    }
    const result = await this.putStream(key, createReadStream(file), opts);
    if (opts.move) await unlink(file).catch(() => undefined);
    return result;
  }

  async get(key: string, range?: ByteRange): Promise<GetResult> {
    const Key = this.full(key);
    const invalid = range && (!Number.isInteger(range.start) || range.start < 0 || (range.end !== undefined && range.end < range.start));
    try {
      if (invalid) {
        const head = await this.stat(key);
        if (!head) throw new StorageError("not_found", `No object ${key}`, { key });
        resolveRange(key, head.size, range); // throws
      }
      const r = await this.client.send(
        new GetObjectCommand({
          Bucket: this.bucket,
          Key,
          Range: range ? `bytes=${range.start}-${range.end ?? ""}` : undefined,
        }),
      );
      const length = Number(r.ContentLength ?? 0);
      const total = /\/(\d+)$/.exec(r.ContentRange ?? "");
      const size = total ? Number(total[1]) : length;
      const start = range ? range.start : 0;
      return {
        body: (r.Body as Readable | undefined) ?? Readable.from([]),
        size,
        start,
        end: start + length - 1,
        contentLength: length,
        contentType: r.ContentType,
      };
    } catch (err) {
      if (statusOf(err) === 416 || (err as SdkError)?.name === "InvalidRange") {
        const head = await this.stat(key);
        throw new StorageError("range_not_satisfiable", `Bytes ${range?.start}-${range?.end ?? ""} are outside ${key}`, {
          size: head?.size ?? 0,
        });
      }
      throw this.wrap(err, key);
    }
  }

  async stat(key: string): Promise<StoredObject | null> {
    try {
      const r = await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: this.full(key) }));
      return { key, size: Number(r.ContentLength ?? 0), modifiedAt: r.LastModified ?? new Date(0) };
    } catch (err) {
      if (isNotFound(err)) return null;
      throw this.wrap(err, key);
    }
  }

  async exists(key: string): Promise<boolean> {
    return (await this.stat(key)) !== null;
  }

  async list(prefix: string): Promise<StoredObject[]> {
    const Prefix = this.keyPrefix + validatePrefix(prefix);
    const out: StoredObject[] = [];
    let token: string | undefined;
    try {
      do {
        const r = await this.client.send(new ListObjectsV2Command({ Bucket: this.bucket, Prefix, ContinuationToken: token }));
        for (const o of r.Contents ?? []) {
          out.push({ key: o.Key!.slice(this.keyPrefix.length), size: Number(o.Size ?? 0), modifiedAt: o.LastModified ?? new Date(0) });
        }
        token = r.IsTruncated ? r.NextContinuationToken : undefined;
      } while (token);
    } catch (err) {
      throw this.wrap(err, prefix);
    }
    return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  }

  async delete(key: string): Promise<void> {
    try {
      await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: this.full(key) }));
    } catch (err) {
      if (!isNotFound(err)) throw this.wrap(err, key);
    }
  }

  async deletePrefix(prefix: string): Promise<number> {
    const keys = (await this.list(prefix)).map((o) => o.key);
    for (let i = 0; i < keys.length; i += 1000) {
      const batch = keys.slice(i, i + 1000);
      try {
        const r = await this.client.send(
          new DeleteObjectsCommand({
            Bucket: this.bucket,
            Delete: { Objects: batch.map((k) => ({ Key: this.full(k) })), Quiet: true },
          }),
        );
        if (r.Errors?.length) throw new StorageError("io_error", `Could not delete ${r.Errors.length} objects under ${prefix}`);
      } catch (err) {
        if (err instanceof StorageError || statusOf(err) === 403) throw this.wrap(err, prefix);
        // Some S3-compatible servers refuse bulk delete (it needs a body checksum they do not
        // accept): delete one by one instead.
        for (const k of batch) await this.delete(k);
      }
    }
    return keys.length;
  }

  localPath(): null {
    return null;
  }

  async freeBytes(): Promise<null> {
    return null;
  }
}
