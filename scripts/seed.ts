// Load the demo club into DATABASE_URL (idempotent).
import { seedDemo } from "../server/seed";
import { db } from "../server/db/client";

await seedDemo();
await db().pool.end();
