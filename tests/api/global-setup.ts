// Builds a template database once per run (migrations applied); each test file clones it
// (worker-setup.ts), so API tests run on real PostgreSQL in parallel without sharing rows.
import pg from "pg";
import { runMigrations } from "../../server/db/migrate";

// One template per run, so two runs on one cluster (two developers, or a developer and CI)
// never drop each other's template mid-clone. Workers read its name from the environment.
export const templateDb = () => process.env.LF_TEMPLATE_DB ?? "loadframe_test_template";

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

async function admin<T>(fn: (c: pg.Client) => Promise<T>) {
  const c = new pg.Client({ connectionString: adminUrl() });
  await c.connect();
  try {
    return await fn(c);
  } finally {
    await c.end();
  }
}

export default async function setup() {
  const name = `loadframe_tmpl_${process.pid}_${Date.now().toString(36)}`;
  process.env.LF_TEMPLATE_DB = name;
  await admin(async (c) => {
    // templates left behind by runs that were killed
    const stale = await c.query<{ datname: string }>(
      "select datname from pg_database where datname like 'loadframe_tmpl_%' and (pg_stat_file('base/'||oid||'/PG_VERSION')).modification < now() - interval '2 hours'",
    );
    for (const r of stale.rows) await c.query(`drop database if exists ${r.datname} with (force)`);
    await c.query(`create database ${name}`);
  });
  await runMigrations(dbUrl(name));
  return async () => {
    await admin((c) => c.query(`drop database if exists ${name} with (force)`));
  };
}
