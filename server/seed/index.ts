import { seedPeople, type DemoIds } from "./demo-people";
import { sticksSeedSteps } from "./sticks";
import { clipsSeedSteps } from "./clips";
import { shotsSeedSteps } from "./shots";

// Demo data steps, run in order by scripts/seed.ts; each is idempotent (a second run adds nothing).
// Each area keeps its own steps in server/seed/<area>.ts.
export const seedSteps: { name: string; run: (ids: DemoIds) => Promise<void> }[] = [...sticksSeedSteps, ...clipsSeedSteps, ...shotsSeedSteps];

export async function seedDemo() {
  const ids = await seedPeople();
  for (const step of seedSteps) await step.run(ids);
  return ids;
}
