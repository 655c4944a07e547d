import { execFileSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { expect, test } from "@playwright/test";

// A new club from sign-up to its first upload on a paid plan: the e-mail is confirmed through the
// real message in the mail sink, the club starts on Pond, pays for Rink on the payments fake's
// hosted page (scripts/test starts it), the plan changes when the webhook lands, and a clip uploads.

const inbox = process.env.TEST_INBOX_URL ?? "http://127.0.0.1:1180";

async function mailedLink(to: string, subject: RegExp, link: RegExp) {
  for (let i = 0; i < 50; i++) {
    const mails = (await (await fetch(`${inbox}/api/email`)).json()) as { to: { address: string }[]; subject: string; text: string }[];
    const found = mails.filter((x) => x.to.some((t) => t.address === to) && subject.test(x.subject)).at(-1)?.text.match(link)?.[0];
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to} matching ${subject}`);
}

function makeClip() {
  const file = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-e2e-")), "first-shot.mp4");
  execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", "-f", "lavfi", "-i", "testsrc2=size=320x180:rate=240",
    "-frames:v", "60", "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", file]);
  return file;
}

test("a new club signs up, confirms its e-mail, pays for Rink with a test card and uploads its first clip", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const email = `founder-${Date.now()}@otters.example`;

  await page.goto("/sign-in");
  await page.getByRole("link", { name: "Sign up your club" }).click();
  await page.getByLabel("Your e-mail").fill(email);
  await page.getByRole("button", { name: "Send the confirmation link" }).click();
  await expect(page.getByText("Check your inbox")).toBeVisible();

  await page.goto(await mailedLink(email, /Confirm your e-mail/, /https?:\/\/\S+\/sign-up\/[\w-]+/));
  await expect(page.getByText(`Signing up as ${email}`)).toBeVisible();
  await page.getByLabel("Club").fill("Harbour Otters");
  await page.getByLabel("First team").fill("Otters U18");
  await page.getByLabel("Your name").fill("Alex Marsh");
  await page.getByLabel("Password", { exact: true }).fill("harbour-otters-1");
  await page.getByLabel("Password again").fill("harbour-otters-1");
  await page.getByRole("button", { name: "Create the club" }).click();

  // Lands on the free plan with its limits shown.
  await expect(page.getByText("Welcome! Harbour Otters is ready.")).toBeVisible();
  const plans = page.getByRole("list", { name: "Plans" });
  await expect(plans.locator("li[aria-current]")).toContainText("Pond");
  await expect(page.getByRole("meter", { name: "Staff seats" })).toHaveAttribute("aria-valuemax", "3");

  // Pays on the hosted page: leaves the app and comes back.
  await plans.getByRole("button", { name: "Choose Rink" }).click();
  await expect(page.getByText("Test payment page of the local payments fake")).toBeVisible();
  await expect(page.getByText("$39.00").first()).toBeVisible();
  await page.getByLabel("Card number").fill("4242 4242 4242 4242");
  await page.getByLabel("Expiry (MM/YY)").fill("12/34");
  await page.getByLabel("CVC").fill("123");
  await page.getByRole("button", { name: /^Pay / }).click();
  await expect(page).toHaveURL(/\/billing/);
  await expect(plans.locator("li[aria-current]")).toContainText("Rink", { timeout: 15_000 });
  await expect(page.getByText(/Renews on/)).toBeVisible();
  await expect(page.getByRole("cell", { name: "First month" })).toBeVisible();

  // A clip belongs to a player: the club's first player joins through an invitation.
  const playerEmail = `skater-${Date.now()}@otters.example`;
  await page.goto("/roster");
  const form = page.locator("form").filter({ has: page.getByRole("button", { name: "Send invitation" }) });
  await form.getByLabel("E-mail").fill(playerEmail);
  await form.getByLabel("Role", { exact: true }).selectOption("player");
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByRole("cell", { name: playerEmail })).toBeVisible();
  const invite = await mailedLink(playerEmail, /invited/, /https?:\/\/\S+\/invite\/[\w-]+/);
  const player = await (await browser.newContext()).newPage();
  await player.goto(new URL(invite).pathname);
  await player.getByLabel("Your name").fill("Kit Skater");
  await player.getByLabel("Password", { exact: true }).fill("otters-skater-1");
  await player.getByLabel("Password again").fill("otters-skater-1");
  await player.getByRole("button", { name: /join|create/i }).click();
  await expect(player).not.toHaveURL(/invite/);

  // The first upload, on the paid plan.
  await page.goto("/clips");
  await page.getByTestId("clip-file-input").setInputFiles(makeClip());
  const item = page.getByRole("listitem", { name: "Upload of first-shot.mp4" });
  await item.getByLabel("Player").selectOption({ label: "Kit Skater" });
  await item.getByLabel("Shot type").selectOption("wrist");
  await item.getByLabel("Venue").fill("Harbour rink");
  await item.getByLabel("Drill").fill("Wrist shots");
  await item.getByRole("button", { name: "Upload" }).click();
  await expect(item.getByText("Stored", { exact: true })).toBeVisible({ timeout: 30_000 });
  await expect(page.locator("tr", { hasText: "first-shot" })).toBeVisible();
});
