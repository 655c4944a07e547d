import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// Home answers "what needs me now?" by role: a coach finds a shot waiting for review and opens it
// from home; a team admin finds a pending invitation and the staff seats; a player finds their own
// latest results and bests (each a link to the shot) and nothing staff do; a brand-new player is
// told what to expect.

/** With SCREENSHOT_DIR set, home at desktop, tablet and phone size, to look at. */
async function shoot(page: Page, name: string) {
  const dir = process.env.SCREENSHOT_DIR;
  if (!dir) return;
  for (const [w, h, size] of [[1366, 850, "desktop"], [1024, 768, "tablet"], [390, 844, "phone"]] as const) {
    await page.setViewportSize({ width: w, height: h });
    await page.screenshot({ path: `${dir}/home-${name}-${size}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1366, height: 850 });
}

async function teamOf(page: Page) {
  return ((await (await page.request.get("/api/me")).json()) as { activeTeamId: string }).activeTeamId;
}

test("coach: a shot taken back to review shows on home as waiting for review, linked to its readout", async ({ page }) => {
  await signIn(page, "coach@ravens.example");
  const teamId = await teamOf(page);
  const shots = (await (await page.request.get(`/api/teams/${teamId}/readout/shots?pageSize=50`)).json()) as { shots: { id: string; label: string; published: boolean; hasResults: boolean }[] };
  const shot = shots.shots.find((s) => s.published && s.hasResults && s.label)!;
  expect((await page.request.delete(`/api/teams/${teamId}/readout/shots/${shot.id}/publication`)).status()).toBe(200);
  try {
    await page.goto("/");
    await expect(page.getByRole("heading", { name: "Needs you now" })).toBeVisible();
    const review = page.getByTestId("home-task-shotsToReview");
    await expect(review).toContainText(/wait|waits/);
    await expect(page.getByTestId("home-task-invitationsPending")).toHaveCount(0);
    await expect(page.getByTestId("home-task-staffSeats")).toHaveCount(0);
    await shoot(page, "coach");
    await review.getByRole("link", { name: new RegExp(`^${shot.label.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")} — `) }).click();
    await expect(page).toHaveURL(new RegExp(`/readout/${shot.id}$`));
    await expect(page.getByTestId("review-bar")).toHaveAttribute("data-state", "review");
    await page.goto("/");
    await page.getByTestId("home-task-shotsToReview").getByRole("link").first().click();
    await expect(page).toHaveURL(/\/readout\?review=waiting/);
  } finally {
    await page.request.put(`/api/teams/${teamId}/readout/shots/${shot.id}/publication`, { data: { notify: false } });
  }
});

test("team admin: a pending invitation and the club's staff seats, each a link", async ({ page }) => {
  await signIn(page, "admin@ravens.example");
  const teamId = await teamOf(page);
  const email = `home-${Date.now().toString(36)}@ravens.example`;
  const inv = await page.request.post(`/api/teams/${teamId}/invitations`, { data: { email, role: "analyst" } });
  expect(inv.status()).toBe(201);
  const { id } = (await inv.json()) as { id: string };
  try {
    await page.goto("/");
    const invitations = page.getByTestId("home-task-invitationsPending");
    await expect(invitations).toContainText(`${email} (analyst)`);
    await expect(page.getByTestId("home-task-staffSeats")).toContainText(/\d+ of \d+ staff seats taken on the \w+ plan/);
    await shoot(page, "admin");
    await page.getByTestId("home-task-staffSeats").getByRole("link").click();
    await expect(page).toHaveURL(/\/billing$/);
    await page.goto("/");
    await invitations.getByRole("link", { name: `${email} (analyst)` }).click();
    await expect(page).toHaveURL(/\/roster$/);
  } finally {
    await page.request.delete(`/api/teams/${teamId}/invitations/${id}`);
  }
});

test("player: their latest results and bests by shot type, each a link to the shot; nothing staff do", async ({ page }) => {
  await signIn(page, "player@ravens.example");
  await expect(page.getByRole("heading", { name: "Your shots" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Needs you now" })).toHaveCount(0);
  const latest = page.getByTestId("home-latest");
  await expect(latest.getByRole("link").first()).toBeVisible();
  await expect(latest.getByRole("link").first()).toContainText(/±/);
  await expect(page.getByTestId("home-bests").getByRole("link").first()).toContainText("fastest");
  await shoot(page, "player");
  // No staff work, no admin areas, and no card offering what a player cannot do.
  await expect(page.locator("[data-testid^=home-task-]")).toHaveCount(0);
  const main = page.getByRole("main");
  for (const area of ["Roster", "Plan", "Audit log"]) await expect(main.getByRole("link", { name: new RegExp(`^${area}`) })).toHaveCount(0);
  await expect(main).not.toContainText(/Upload high-frame-rate|run three-point bench flex tests/);
  const href = await latest.getByRole("link").first().getAttribute("href");
  await latest.getByRole("link").first().click();
  await expect(page).toHaveURL(new RegExp(`${href}$`));
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expect(page.getByText("Shot not found")).toHaveCount(0);
});

test("a brand-new player is told what to expect", async ({ page, browser }) => {
  await signIn(page, "admin@ravens.example");
  const teamId = await teamOf(page);
  const email = `rookie-${Date.now().toString(36)}@ravens.example`;
  const { id } = (await (await page.request.post(`/api/teams/${teamId}/invitations`, { data: { email, role: "player" } })).json()) as { id: string };
  const rookie = await browser.newPage();
  const accepted = await rookie.request.post(`/api/invitations/${id}/accept`, { data: { name: "Riley Rookie", password: "rookie-password-1" } });
  expect(accepted.ok(), await accepted.text()).toBe(true);
  // Accepting signs the new account in, as the invitation page does.
  await rookie.goto("/");
  const expectBox = rookie.getByTestId("home-new-player");
  await expect(expectBox).toBeVisible();
  await expect(expectBox).toContainText("What to expect");
  await expect(rookie.getByTestId("home-latest")).toHaveCount(0);
  await shoot(rookie, "new-player");
});
