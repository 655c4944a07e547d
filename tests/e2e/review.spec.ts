import { expect, test, type Browser } from "@playwright/test";
import { signIn } from "./support/sign-in";

// Review before players see: a coach takes a shot back to review (its player loses it), publishes
// it again (the player has it back), shares it with a teammate (who can open it) and stops sharing
// (the teammate cannot any more). Each person in their own browser.

async function as(browser: Browser, email: string) {
  const page = await browser.newPage();
  await signIn(page, email);
  return page;
}

test("publish, take back, share with a teammate and stop sharing: each person sees exactly what they may", async ({ browser }) => {
  test.setTimeout(180_000); // three people each signed in in their own browser
  const coach = await as(browser, "coach@ravens.example");
  const me = (await (await coach.request.get("/api/me")).json()) as { activeTeamId: string };
  const list = (await (await coach.request.get(`/api/teams/${me.activeTeamId}/readout/shots?pageSize=200`)).json()) as { shots: { id: string; label: string; playerName: string; published: boolean }[] };
  const shot = list.shots.find((s) => s.playerName === "Theo Marchetti" && s.published)!;
  expect(shot, "a published demo shot of Theo's").toBeTruthy();
  const url = `/readout/${shot.id}`;

  const theo = await as(browser, "player@ravens.example");
  await theo.goto(url);
  await expect(theo.getByRole("heading", { level: 1 })).toBeVisible();
  await expect(theo.getByTestId("review-bar")).toHaveCount(0);

  // Back to review: Theo's next visit finds nothing.
  await coach.goto(url);
  await expect(coach.getByTestId("review-bar")).toHaveAttribute("data-state", "published");
  await coach.getByRole("button", { name: "Take back to review" }).click();
  await expect(coach.getByTestId("review-bar")).toHaveAttribute("data-state", "review");
  await theo.reload();
  await expect(theo.getByRole("heading", { name: "Shot not found" })).toBeVisible();

  // Published again (without an e-mail): Theo has it back.
  await coach.getByLabel(/E-mail Theo/).uncheck();
  await coach.getByRole("button", { name: "Publish to Theo" }).click();
  await expect(coach.getByTestId("review-bar")).toHaveAttribute("data-state", "published");
  await expect(coach.getByTestId("review-bar")).toContainText("by Morgan Ashby");
  await theo.reload();
  await expect(theo.getByText("Shot not found")).toHaveCount(0);
  await expect(theo.getByRole("heading", { level: 1 })).toBeVisible();

  // A teammate cannot open it until the coach shares it with him.
  const jonah = await as(browser, "player2@ravens.example");
  await jonah.goto(url);
  await expect(jonah.getByRole("heading", { name: "Shot not found" })).toBeVisible();
  await coach.getByRole("button", { name: "Share…" }).click();
  const dialog = coach.getByRole("dialog", { name: "Share this shot" });
  await dialog.getByRole("checkbox", { name: /Theo Marchetti/ }).uncheck();
  await dialog.getByRole("checkbox", { name: "Jonah Okafor" }).check();
  await dialog.getByRole("button", { name: "Share", exact: true }).click();
  await expect(coach.getByRole("button", { name: "Stop sharing with Jonah Okafor" })).toBeVisible();
  await jonah.reload();
  await expect(jonah.getByText("Shared with you")).toBeVisible();
  await jonah.goto("/readout");
  await expect(jonah.getByTestId("shot-row").filter({ hasText: "Shared with you" })).toHaveCount(1);

  // Un-sharing removes that access at once.
  await coach.getByRole("button", { name: "Stop sharing with Jonah Okafor" }).click();
  await expect(coach.getByText("Not shared yet.")).toBeVisible();
  await jonah.goto(url);
  await expect(jonah.getByRole("heading", { name: "Shot not found" })).toBeVisible();
});

test("staff find the shots waiting for review on the Shots page; the team admin can let results publish themselves", async ({ page }) => {
  await signIn(page, "admin@ravens.example");
  await page.goto("/readout");
  const setting = page.getByTestId("review-setting");
  await expect(setting).toContainText("wait for a coach");
  const filtered = page.waitForResponse((r) => r.url().includes("review=waiting"));
  await page.getByLabel("Review").selectOption("waiting");
  await expect(page).toHaveURL(/review=waiting/);
  await filtered;
  for (const row of await page.getByTestId("shot-row").all()) await expect(row).toContainText("In review");
  await setting.getByLabel("Publish results automatically").check();
  await expect(setting).toContainText("as soon as they have results");
  await expect(page.getByText("No shot matches these filters.")).toBeVisible();
  await setting.getByLabel("Publish results automatically").uncheck();
  await expect(setting).toContainText("wait for a coach");
});
