// Entry of the CPU worker threads (pool.ts). It loads the TypeScript task table through tsx's own
// loader API, so threads work whether or not the parent process was started with --import tsx.
import { tsImport } from "tsx/esm/api";

const { tasks } = await tsImport("./tasks.ts", import.meta.url);

export default function run({ task, input }) {
  return tasks[task](input);
}
