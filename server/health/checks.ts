// Readiness checks beyond the database (which routes.ts always checks first). A check resolves
// with a short detail for the operator, or throws with the reason it is not ready.
import { checkFfmpeg, checkQueue, checkStorage } from "./readiness";

export const readinessChecks: Record<string, () => Promise<unknown>> = {
  queue: checkQueue,
  storage: checkStorage,
  ffmpeg: checkFfmpeg,
};
