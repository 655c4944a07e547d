import { z } from "zod";
import { DEFAULT_PRICE_IDS } from "../shared/billing/plans";
import { GB } from "../shared/bytes";

// The whole server configuration, validated once at start-up. A bad or missing value stops the
// process with one readable line per problem rather than failing later in a request.
const bool = z
  .enum(["true", "false", "1", "0"])
  .transform((v) => v === "true" || v === "1");

const EnvSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  HOST: z.string().default("127.0.0.1"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  PUBLIC_URL: z.string().url().default("http://127.0.0.1:3000"),
  /** Which proxies' X-Forwarded-For to believe (Express "trust proxy": names such as loopback,
   * uniquelocal, or addresses/subnets, comma-separated). Unset: none, every client is the address
   * it connects from, so a client cannot pick its own address by sending the header. */
  TRUST_PROXY: z.string().regex(/^[\w.:/, ]+$/, "TRUST_PROXY: names (loopback, uniquelocal) or addresses, comma-separated").optional(),
  DATABASE_URL: z.string().url({ message: "DATABASE_URL must be a postgres:// URL" }),
  AUTH_SECRET: z.string().min(32, "AUTH_SECRET must be at least 32 characters"),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().default(1025),
  MAIL_FROM: z.string().default("Loadframe <no-reply@loadframe.local>"),
  MAIL_INBOX_URL: z.string().default("http://127.0.0.1:1080"),
  UPLOAD_DIR: z.string().default("uploads"),
  STORAGE: z.enum(["local", "s3"]).default("local"),
  S3_ENDPOINT: z.string().optional(),
  S3_BUCKET: z.string().default("loadframe"),
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  S3_REGION: z.string().default("us-east-1"),
  FFMPEG_PATH: z.string().default("ffmpeg"),
  FFPROBE_PATH: z.string().default("ffprobe"),
  FRAME_FORMAT: z.enum(["jpg", "webp"]).default("jpg"),
  FRAME_QUALITY: z.coerce.number().int().min(1).max(31).default(3),
  /** Grey frames a tracking run keeps in memory (MB); more wait in a file in its job folder. */
  TRACK_MEMORY_MB: z.coerce.number().int().min(16).max(65536).default(768),
  /** Seconds a queued recompute waits for the triggers (calibration writes, bench tests) to pause (decision 125). */
  RECOMPUTE_DELAY_SECONDS: z.coerce.number().min(0).max(60).default(1),
  MAX_UPLOAD_BYTES: z.coerce.number().int().positive().default(4 * GB),
  MAX_PIXELS: z.coerce.number().int().positive().default(4096 * 2160),
  EMBEDDED_WORKER: bool.default(true),
  /** Web processes sharing PORT (node:cluster); 1 = this process serves requests itself. */
  WEB_PROCESSES: z.coerce.number().int().min(1).max(64).default(1),
  RATE_LIMIT: bool.default(true),
  // The payment service, through its SDK (server/billing/payments.ts). Without a secret key, plans
  // still apply but checkout is off. Host/port/protocol point the SDK at the local fake; unset,
  // the SDK's own address is used (a real account).
  PAYMENTS_SECRET_KEY: z.string().min(1).optional(),
  PAYMENTS_WEBHOOK_SECRET: z.string().min(1).optional(),
  PAYMENTS_API_HOST: z.string().min(1).optional(),
  PAYMENTS_API_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  PAYMENTS_API_PROTOCOL: z.enum(["http", "https"]).optional(),
  PAYMENTS_PRICE_RINK: z.string().min(1).default(DEFAULT_PRICE_IDS.rink),
  PAYMENTS_PRICE_ARENA: z.string().min(1).default(DEFAULT_PRICE_IDS.arena),
  /** Days a club keeps full use after a failed renewal before its teams turn read-only. */
  BILLING_GRACE_DAYS: z.coerce.number().min(0).max(90).default(14),
  LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
});

export type Env = z.infer<typeof EnvSchema>;

export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = EnvSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".") || "(env)"}: ${i.message}`);
    throw new Error(`Loadframe cannot start, the environment is not valid:\n${lines.join("\n")}`);
  }
  return parsed.data;
}

let cached: Env | undefined;
/** The validated environment of this process (parsed on first use). */
export function env(): Env {
  cached ??= parseEnv();
  return cached;
}
