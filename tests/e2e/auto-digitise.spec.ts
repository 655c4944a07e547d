import { copyFileSync, mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { expect, test, type Locator, type Page } from "@playwright/test";
import { LANDMARKS } from "../../shared/schemas/shot-document";
import { renderClip } from "../../scripts/demo/render-scene";
import { TRACK_LOOKS, TRACK_SHOTS } from "../unit/tracking/support/shot-clips";
import { getJson, signIn } from "./digitise-support";
import { uploadClip } from "./support/upload";

// From an empty shot to its results with auto-digitise, counting every click and key press the
// analyst makes on the page (the set-up — signing in, uploading the clip, creating the shot,
// opening the page — is not the analyst's digitising and is not counted). The clip is a generated
// slap shot at 1,000 fps (tests/unit/tracking/support/shot-clips.ts); its truth checks the numbers.

const ANALYST = "analyst@ravens.example";

/** Every action the analyst takes goes through here, so none is left uncounted. */
function counter(page: Page) {
  let n = 0;
  return {
    get count() {
      return n;
    },
    async click(l: Locator) {
      n++;
      await l.click();
    },
    /** A click on the picture at a frame pixel, through the viewer's current view. */
    async clickFrame(x: number, y: number) {
      n++;
      const viewer = page.getByTestId("frame-viewer");
      const [zoom, panX, panY] = (await viewer.getAttribute("data-view"))!.split(" ").map(Number);
      const box = (await viewer.boundingBox())!;
      await page.mouse.click(box.x + panX + x * zoom, box.y + panY + y * zoom);
    },
  };
}

test("an empty shot to results in at most 15 clicks: seeds on one frame, track, accept", async ({ page, baseURL }) => {
  test.setTimeout(240_000);
  const base = baseURL!;
  await signIn(page, ANALYST);
  const me = await getJson(page, "/api/me");
  const teamId: string = me.activeTeamId ?? me.teams[0].id;
  const scene = TRACK_SHOTS[1000];
  const rendered = await renderClip([scene], { look: TRACK_LOOKS[1000] });
  const truth = rendered.scenes[0];
  const file = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-e2e-")), "auto-digitise.mp4");
  copyFileSync(rendered.mp4, file);
  const players = (await getJson(page, `/api/teams/${teamId}/clip-options`)).players as { id: string }[];
  const clipId = await uploadClip(page, base, teamId, file, {
    playerId: players[0].id,
    title: "Auto-digitise check, 1,000 fps", newSession: { date: "2026-12-01", venue: "Lakeport Arena", drill: "Slap shots" }, shotType: "slap", cameraView: "side", captureFps: 1000, captureFpsConfirmed: true,
  });
  const r = await page.request.post(`/api/teams/${teamId}/clips/${clipId}/shots`, { data: { frameStart: 1, frameEnd: truth.frameCount, label: "Auto-digitised" } });
  expect(r.status(), await r.text()).toBe(201);
  const shotId = (await r.json()).id as string;
  await page.goto(`/clips/${clipId}/shots/${shotId}/digitise?frame=1`);
  await expect(page.getByTestId("frame-viewer")).toHaveAttribute("data-frame", "1");
  await expect(page.getByTestId("calibration-warning")).toBeVisible();

  const act = counter(page);
  // One frame of seeds: every landmark, one click each.
  await act.click(page.getByTestId("place-seeds"));
  for (const k of LANDMARKS) {
    const m = truth.tracks[k].find((q) => q[0] === 1)!;
    await expect(page.getByTestId("seed-prompt")).toBeVisible();
    await act.clickFrame(m[1], m[2]);
  }
  await expect(page.getByTestId("seed-prompt")).toBeHidden();
  await act.click(page.getByTestId("track-shot"));
  await expect(page.getByTestId("tracking-progress").or(page.getByTestId("proposals"))).toBeVisible();
  await expect(page.getByTestId("proposals")).toBeVisible({ timeout: 120_000 });
  // One confirmation: every track, the four events and the scale bar from the puck.
  await act.click(page.getByRole("button", { name: "Accept all with the scale bar" }));

  await expect(page.getByTestId("calibration-warning")).toBeHidden();
  const numbers = page.getByTestId("preview-numbers");
  await expect(numbers).toContainText("Puck exit speed", { timeout: 30_000 });
  await expect(page.getByTestId("save-indicator")).toHaveAttribute("data-state", "saved", { timeout: 30_000 });
  expect(act.count).toBeLessThanOrEqual(15);
  console.info(`clicks and key presses from an empty shot to results: ${act.count}`);

  // The stored results: the exit speed within 2 % of the scene's (seeds clicked at the fitted zoom,
  // a scale bar measured from the puck), events within a frame.
  const shot = await getJson(page, `/api/teams/${teamId}/shots/${shotId}`);
  for (const k of ["iceStrike", "puckStrike", "peakBend", "release"] as const) expect(Math.abs(shot.events[k] - truth.events[k]), k).toBeLessThanOrEqual(1);
  await expect.poll(async () => (await getJson(page, `/api/teams/${teamId}/shots/${shotId}`)).storedResult?.results?.puckExitSpeed?.valueMps ?? null, { timeout: 30_000 }).not.toBeNull();
  const stored = (await getJson(page, `/api/teams/${teamId}/shots/${shotId}`)).storedResult.results;
  expect(Math.abs(stored.puckExitSpeed.valueMps / truth.exitSpeedMps - 1)).toBeLessThan(0.02);
});
