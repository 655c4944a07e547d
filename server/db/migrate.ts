// Apply the generated migrations in drizzle/ (generated, then ordered by hand where a type change needs it, e.g. 0020) to DATABASE_URL.
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { makeDb } from "./client";

export async function runMigrations(url: string) {
  // No request deadline: a migration may rewrite a large table (0020 on 50,000 stored results).
  const d = makeDb(url, { queryDeadline: false });
  try {
    await migrate(d, { migrationsFolder: "drizzle" });
  } finally {
    await d.pool.end();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set");
    process.exit(2);
  }
  await runMigrations(url);
}
