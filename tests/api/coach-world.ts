// The clip API tests' common setting: the in-process server, the demo world, the job queue
// working in this process, and the coach signed in. Import ./clips-support before this file.
import { afterAll, beforeAll, expect } from "vitest";
import { clipMeta, tusUpload, waitFor } from "./clips-support";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";
import { startJobs, stopJobs } from "../../server/jobs/runtime";

export interface CoachWorld {
  srv: TestServer;
  world: Awaited<ReturnType<typeof seedWorld>>;
  coach: Client;
}

export function useCoachWorld(): CoachWorld {
  const w = {} as CoachWorld;
  beforeAll(async () => {
    w.srv = await startServer();
    w.world = await seedWorld();
    await startJobs({ work: true });
    w.coach = await new Client(w.srv.url).signIn(EMAILS.coach);
  });
  afterAll(async () => {
    await stopJobs();
    await w.srv.close();
  });
  return w;
}

/** The team's API root. */
export const teamPath = (w: CoachWorld) => `/api/teams/${w.world.teamId}`;

/** tus metadata of a clip of the world's player (`over` changes its clip fields). */
export const clipUpload = (w: CoachWorld, filename: string, over: Record<string, unknown> = {}) => ({
  teamId: w.world.teamId, filename, meta: JSON.stringify(clipMeta({ playerId: w.world.users[EMAILS.player], ...over })),
});

/** Uploads a file (or bytes) as the coach and waits until its clip is ready; a failed clip throws its reason. */
export async function uploadReady(w: CoachWorld, data: string | Buffer, filename: string, over: Record<string, unknown> = {}) {
  const r = await tusUpload(w.srv.url, w.coach, data, clipUpload(w, filename, over));
  expect(r.ok, JSON.stringify(r.body)).toBe(true);
  return waitFor(
    "clip ready",
    async () => {
      const c = (await w.coach.get(`${teamPath(w)}/clips/${r.body.clip.id}`)).json;
      if (c.status === "failed") throw new Error(c.failureReason);
      return c.status === "ready" && c;
    },
    60_000,
  );
}
