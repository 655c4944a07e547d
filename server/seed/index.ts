import { seedPeople, type DemoIds } from "./demo-people";

// Demo data steps, run in order by scripts/seed.ts; each is idempotent (a second run adds nothing).
// Feature areas append their step here (sticks and bench tests, clips and shots).
export const seedSteps: { name: string; run: (ids: DemoIds) => Promise<void> }[] = [];

export async function seedDemo() {
  const ids = await seedPeople();
  for (const step of seedSteps) await step.run(ids);
  return ids;
}
