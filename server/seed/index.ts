import { seedPeople, type DemoIds } from "./demo-people";
import { sticksSeedSteps } from "./sticks";
import { clipsSeedSteps } from "./clips";
import { shotsSeedSteps } from "./shots";
import { seasonSeedSteps } from "./season";

export interface SeedOptions {
  /** Also the demo season (server/seed/season.ts): on for scripts/start, off for tests that count the small demo. */
  season?: boolean;
  /** Told how far a long step is (scripts/seed.ts prints it). */
  progress?: (message: string) => void;
}

type SeedStep = { name: string; run: (ids: DemoIds, o: SeedOptions) => Promise<void> };

// Demo data steps, run in order by scripts/seed.ts; each is idempotent (a second run adds nothing).
// Each area keeps its own steps in server/seed/<area>.ts.
export const seedSteps: SeedStep[] = [...sticksSeedSteps, ...clipsSeedSteps, ...shotsSeedSteps];

export async function seedDemo(o: SeedOptions = {}) {
  const ids = await seedPeople();
  for (const step of [...seedSteps, ...(o.season ? seasonSeedSteps : [])]) await step.run(ids, o);
  return ids;
}
