// A clip uploaded through the resumable-upload endpoint from the test runner, signed in as the
// page is (its cookies), and waited for until its frames are ready. Set-up, not a user's action.
import { readFileSync } from "node:fs";
import path from "node:path";
import * as tus from "tus-js-client";
import { expect, type Page } from "@playwright/test";

export async function uploadClip(page: Page, base: string, teamId: string, file: string, meta: Record<string, unknown>): Promise<string> {
  const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
  const data = readFileSync(file);
  const body = await new Promise<{ clip: { id: string } }>((resolve, reject) => {
    const u = new tus.Upload(data, {
      endpoint: `${base}/api/uploads`,
      headers: { cookie, origin: base },
      metadata: { teamId, filename: path.basename(file), meta: JSON.stringify(meta) },
      retryDelays: [],
      chunkSize: 8 * 1024 * 1024,
      onSuccess: (p) => resolve(JSON.parse(p.lastResponse.getBody())),
      onError: reject,
    });
    u.start();
  });
  const id = body.clip.id;
  await expect
    .poll(async () => (await (await page.request.get(`${base}/api/teams/${teamId}/clips/${id}`)).json()).status, { timeout: 120_000 })
    .toBe("ready");
  return id;
}
