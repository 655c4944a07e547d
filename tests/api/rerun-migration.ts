// Runs one migration file's statements again, over rows a test wrote the way older code did.
import { readFileSync } from "node:fs";

export async function rerunMigration(file: string) {
  const { db } = await import("../../server/db/client");
  const statements = readFileSync(file, "utf8").split("--> statement-breakpoint");
  const c = await db().pool.connect(); // pg_temp lives as long as this one session
  try {
    for (const s of statements) await c.query(s);
  } finally {
    c.release(true);
  }
}
