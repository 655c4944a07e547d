import type { DemoIds } from "./demo-people";

/** Demo-data steps for this area, run in order after the people; each must be idempotent. */
export const clipsSeedSteps: { name: string; run: (ids: DemoIds) => Promise<void> }[] = [];
