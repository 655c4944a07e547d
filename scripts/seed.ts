// Load the demo club into DATABASE_URL (idempotent). DEMO_SEASON=off leaves out the demo season
// (the end-to-end tests count the small demo). --migrate applies the migrations first (one Node
// start instead of two: scripts/start's second run is mostly start-up time).
import { seedDemo } from "../server/seed";
import { db } from "../server/db/client";
import { runMigrations } from "../server/db/migrate";

if (process.argv.includes("--migrate")) await runMigrations(process.env.DATABASE_URL ?? "");
const started = Date.now();
await seedDemo({ season: process.env.DEMO_SEASON !== "off", progress: (m) => process.stdout.write(`  ${m}\n`) });
process.stdout.write(`  demo data ready in ${((Date.now() - started) / 1000).toFixed(1)} s\n`);
await db().pool.end();
