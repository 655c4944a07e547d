import { expect, test, type Page } from "@playwright/test";
import { signIn, theoClip } from "./digitise-support";

// A failed action is reported once: either by the page next to what failed, or by one toast —
// never both, never two toasts. Each failure is made by answering the request with the API's own
// problem shape (the server stays up), as a database outage would.

const ADMIN = "admin@ravens.example";
const DETAIL = "The database is not answering. Try again in a minute.";
const problem = { type: "about:blank", title: "Service Unavailable", status: 503, detail: DETAIL, code: "database_unavailable" };

/** Answer `method` requests whose path matches `re` with the outage problem; others go through. */
async function failing(page: Page, method: string, re: RegExp) {
  await page.route(re, (route) =>
    route.request().method() === method
      ? route.fulfill({ status: 503, contentType: "application/problem+json", body: JSON.stringify(problem) })
      : route.continue(),
  );
}

/** Every report of the failure on the page: toasts (role alert) and messages next to fields. */
const reports = (page: Page) => page.getByText(DETAIL);
const toasts = (page: Page) => page.getByRole("alert").filter({ hasText: DETAIL });

async function newShot(page: Page, label: string) {
  const { teamId, clipId } = await theoClip(page);
  const r = await page.request.post(`/api/teams/${teamId}/clips/${clipId}/shots`, { data: { frameStart: 150, frameEnd: 200, label } });
  expect(r.status(), await r.text()).toBe(201);
  return { teamId, clipId, shotId: (await r.json()).id as string };
}

test("deleting a shot that fails: one toast", async ({ page }) => {
  await signIn(page, ADMIN);
  const s = await newShot(page, "Failing delete");
  await failing(page, "DELETE", /\/api\/teams\/[^/]+\/shots\/[^/]+$/);
  await page.goto(`/clips/${s.clipId}/shots`);
  await page.getByTestId("clip-shot-row").filter({ hasText: "Failing delete" }).getByRole("button", { name: "Delete" }).click();
  await page.getByRole("button", { name: "Delete shot" }).click();
  await expect(toasts(page)).toHaveCount(1);
  await expect(toasts(page)).toContainText("Couldn't delete the shot");
  await page.waitForTimeout(500); // a second report would come in the same tick or the next
  await expect(reports(page)).toHaveCount(1);
});

test("stopping a share that fails: one toast", async ({ page }) => {
  await signIn(page, ADMIN);
  const s = await newShot(page, "Failing unshare");
  const share = await page.request.post(`/api/teams/${s.teamId}/readout/shots/${s.shotId}/shares`, { data: { player: true } });
  expect(share.status(), await share.text()).toBeLessThan(300);
  await failing(page, "DELETE", /\/readout\/shots\/[^/]+\/shares\/[^/]+$/);
  await page.goto(`/readout/${s.shotId}`);
  await page.getByRole("button", { name: /^Stop sharing with / }).click();
  await expect(toasts(page)).toHaveCount(1);
  await expect(toasts(page)).toContainText("Could not stop sharing");
  await page.waitForTimeout(500);
  await expect(reports(page)).toHaveCount(1);
});

test("saving the alert level that fails: the message under the field, and no toast", async ({ page }) => {
  await signIn(page, ADMIN);
  await failing(page, "PATCH", /\/stick-lab\/settings$/);
  await page.goto("/sticks");
  const field = page.getByRole("spinbutton", { name: "% of rated flex" });
  await field.fill(String(Number(await field.inputValue()) === 90 ? 85 : 90));
  await page.getByRole("button", { name: "Save", exact: true }).click();
  await expect(reports(page)).toHaveCount(1);
  await page.waitForTimeout(500);
  await expect(toasts(page)).toHaveCount(0);
  await expect(reports(page)).toHaveCount(1);
});
