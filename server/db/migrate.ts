// Apply the generated migrations in drizzle/ (never hand-edited) to DATABASE_URL.
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { makeDb } from "./client";

export async function runMigrations(url: string) {
  const d = makeDb(url);
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
