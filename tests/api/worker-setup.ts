// Runs before each API test file: a fresh database cloned from the template, and the
// environment the server modules read (they parse it lazily, on first use).
import pg from "pg";
import { randomBytes } from "node:crypto";
import { dbUrl, templateDb } from "./global-setup";

const name = `loadframe_test_${process.env.VITEST_POOL_ID ?? "0"}_${randomBytes(3).toString("hex")}`;
const admin = new pg.Client({ connectionString: process.env.PG_ADMIN_URL });
await admin.connect();
await admin.query(`create database ${name} template ${templateDb()}`);
await admin.end();

process.env.DATABASE_URL = dbUrl(name);
process.env.AUTH_SECRET ??= randomBytes(32).toString("hex");
process.env.NODE_ENV = "test";
process.env.RATE_LIMIT ??= "false";
process.env.LOG_LEVEL ??= "silent";
process.env.SMTP_PORT ??= process.env.TEST_SMTP_PORT ?? "1125";
process.env.MAIL_INBOX_URL ??= process.env.TEST_INBOX_URL ?? "http://127.0.0.1:1180";
process.env.EMBEDDED_WORKER ??= "false";

const { afterAll } = await import("vitest");
afterAll(async () => {
  const { db } = await import("../../server/db/client");
  await db().pool.end().catch(() => {});
  const c = new pg.Client({ connectionString: process.env.PG_ADMIN_URL });
  await c.connect();
  await c.query(`drop database if exists ${name} with (force)`);
  await c.end();
});
