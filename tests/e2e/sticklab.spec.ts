import { expect, test } from "@playwright/test";
import { DEMO_STICK_LABELS } from "../../server/seed/sticks";
import { signIn } from "./support/sign-in";

// The Stick lab's promise end to end on the demo club: an analyst hangs four weights on a used
// 85-flex stick and sees it measure about 71 flex (84 % of rated) with its fit chart; the stick's
// history shows the dip over the season; the beam model marks where the moment peaks. A player
// sees only their own sticks.

test("an analyst bench-tests a used 85 flex, sees ~71 flex (84 %), the season's dip and the beam model's moment peak", async ({ page }) => {
  await signIn(page, "analyst@ravens.example");
  await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Stick lab" }).click();
  await page.getByRole("link", { name: new RegExp(DEMO_STICK_LABELS.usedSenior) }).click();

  // The history: six seeded tests dipping from ~85 to ~71, below the team's 85 % line.
  await expect(page.getByRole("heading", { name: DEMO_STICK_LABELS.usedSenior })).toBeVisible();
  await expect(page.getByText("Below 85 % of its rating")).toBeVisible();
  const history = page.getByRole("img", { name: /Measured flex over 6 bench tests, rated 85/ });
  await expect(history).toBeVisible();
  await expect(history.locator(".recharts-line-dots circle")).toHaveCount(6);
  const flexes = await page.locator("table").first().locator("tbody tr td:nth-child(2)").allInnerTexts();
  expect(flexes.map(Number)).toEqual([...flexes.map(Number)].sort((a, b) => a - b)); // newest first, each softer than the one before
  expect(Number(flexes[0])).toBeLessThan(72);
  expect(Number(flexes.at(-1))).toBeGreaterThan(84);

  // Four weights hung at mid-span of 1,000 mm; 20 lbf per 0.28 in = 71.4 lbf/in, i.e. 71.4 flex [CP: flex = lbf per inch at mid-span].
  await page.getByRole("link", { name: "New bench test" }).click();
  await expect(page.getByText(/Bench loading can snap a shaft and throw fragments/)).toBeVisible();
  await page.getByLabel("Date of the test").fill("2026-11-30");
  await page.getByLabel("Units").selectOption("imperial");
  const readings: [number, number][] = [[20, 0.28], [40, 0.56], [60, 0.84], [80, 1.12]];
  for (const [i, [load, deflection]] of readings.entries()) {
    await page.getByLabel(`Load ${i + 1} (lbf)`).fill(String(load));
    await page.getByLabel(`Deflection ${i + 1} (in)`).fill(String(deflection));
  }
  await expect(page.getByTestId("measured-flex")).toHaveText(/71\.4\s*flex/);
  await page.getByRole("button", { name: "Save bench test" }).click();

  await expect(page).toHaveURL(/\/bench-tests\/[0-9a-f-]{36}$/);
  await expect(page.getByTestId("measured-flex")).toHaveText(/71\.4\s*flex/);
  await expect(page.getByTestId("percent-of-rated")).toHaveText(/84 % of rated 85/);
  const fit = page.getByRole("img", { name: /Load against deflection: 4 readings and the fitted line/ });
  await expect(fit).toBeVisible();
  await expect(fit.locator(".recharts-scatter-symbol")).toHaveCount(4);
  await expect(fit.locator(".recharts-line path.recharts-curve")).toHaveCount(1);

  // Back on the stick: seven tests now.
  await page.getByRole("link", { name: `← ${DEMO_STICK_LABELS.usedSenior}` }).click();
  await expect(page.getByRole("img", { name: /Measured flex over 7 bench tests/ })).toBeVisible();

  // The beam model: the bench set-up puts the peak moment under the weight, mid-stick (1,575 mm stick → 788 mm).
  await page.getByRole("link", { name: "Beam model" }).click();
  await expect(page.getByText(/not a substitute for an engineer's assessment or the stick maker's specifications/)).toBeVisible();
  await expect(page.getByTestId("break-point-summary")).toHaveText(/788 mm from the butt end/);
  await expect(page.getByTestId("break-point")).toBeVisible();
  await expect(page.getByText(/predicted break point/).first()).toBeVisible();

  // From a demo shot taken with this stick (seeded by the shots area): top hand and heel hold, the bottom hand pushes.
  const shotValue = await page.locator('optgroup[label="A digitised shot with this stick"] option').first().getAttribute("value");
  expect(shotValue).toMatch(/^shot:/);
  await page.getByLabel("Start from").selectOption(shotValue!);
  await expect(page).toHaveURL(/\?shot=/);
  await expect(page.getByText("Bottom hand's push")).toBeVisible();
  await expect(page.getByTestId("break-point-summary")).toHaveText(/\d+ mm from the top hand/);
  await expect(page.getByTestId("break-point")).toBeVisible();

  // Move the bottom hand: the peak moves with it.
  await page.getByLabel("Start from").selectOption("hands");
  await page.getByLabel("Position of load 1").fill("500");
  await expect(page.getByTestId("break-point-summary")).toHaveText(/500 mm from the butt end/);
  await page.getByLabel("Position of load 1").fill("1600");
  await expect(page.getByText(/load 1 at 1600 mm is outside the stick/i)).toBeVisible();
});

test("a player sees only their own sticks, without bench-test or edit buttons", async ({ page }) => {
  await signIn(page, "player@ravens.example");
  await page.goto("/sticks");
  await expect(page.getByRole("link", { name: new RegExp(DEMO_STICK_LABELS.usedSenior) })).toBeVisible();
  await expect(page.getByRole("link", { name: new RegExp(DEMO_STICK_LABELS.newSenior) })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Add stick" })).toHaveCount(0);
  await page.getByRole("link", { name: new RegExp(DEMO_STICK_LABELS.usedSenior) }).click();
  await expect(page.getByRole("img", { name: /Measured flex over/ })).toBeVisible();
  await expect(page.getByRole("link", { name: "New bench test" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Edit" })).toHaveCount(0);
});
