// Builds a template database once per run (migrations applied); each test file clones it
// (worker-setup.ts), so API tests run on real PostgreSQL in parallel without sharing rows.
import pg from "pg";
import { runMigrations } from "../../server/db/migrate";

export const TEMPLATE_DB = "loadframe_test_template";

function adminUrl() {
  const url = process.env.PG_ADMIN_URL;
  if (!url) throw new Error("PG_ADMIN_URL is not set: run the API tests through scripts/test, which starts the private cluster.");
  return url;
}

export function dbUrl(name: string) {
  const u = new URL(adminUrl());
  u.pathname = `/${name}`;
  return u.toString();
}

export default async function setup() {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  await c.query(`drop database if exists ${TEMPLATE_DB} with (force)`);
  await c.query(`create database ${TEMPLATE_DB}`);
  await c.end();
  await runMigrations(dbUrl(TEMPLATE_DB));
}
