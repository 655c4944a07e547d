// Sign in through the UI with a demo account; waits until the app has left the sign-in page.
import { expect, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "../../../server/seed/demo-people";

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).not.toHaveURL(/sign-in/);
}
