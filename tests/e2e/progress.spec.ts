import { expect, test } from "@playwright/test";
import { signIn } from "./support/sign-in";

// Progress shows one shot type at a time by default (the player's most common), and every type
// on request, with dots coloured by type when more than one is in view.

test("progress opens on the player's most common shot type; All types is one choice away", async ({ page }) => {
  await signIn(page, "player@ravens.example");
  await page.goto("/progress");
  const type = page.getByLabel("Shot type");
  await expect(page.getByTestId("trend-puckExitSpeed")).toBeVisible();
  await expect(type).not.toHaveValue("all");
  const shown = await type.inputValue();
  await expect(type.locator(`option[value="${shown}"]`)).toHaveText(/\(\d+\)$/);
  if (process.env.SCREENSHOT_DIR)
    for (const [w, h, size] of [[1366, 850, "desktop"], [1024, 768, "tablet"], [390, 844, "phone"]] as const) {
      await page.setViewportSize({ width: w, height: h });
      await page.screenshot({ path: `${process.env.SCREENSHOT_DIR}/progress-${size}.png`, fullPage: true });
    }
  await type.selectOption("all");
  await expect(page).toHaveURL(/type=all/);
  await expect(type).toHaveValue("all");
  await expect(page.getByTestId("trend-puckExitSpeed")).toBeVisible();
});
