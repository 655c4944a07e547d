// Load the demo club into DATABASE_URL (idempotent). DEMO_SEASON=off leaves out the demo season
// (the end-to-end tests count the small demo).
import { seedDemo } from "../server/seed";
import { db } from "../server/db/client";

const started = Date.now();
await seedDemo({ season: process.env.DEMO_SEASON !== "off", progress: (m) => process.stdout.write(`  ${m}\n`) });
process.stdout.write(`  demo data ready in ${((Date.now() - started) / 1000).toFixed(1)} s\n`);
await db().pool.end();
