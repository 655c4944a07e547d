import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { expect, test } from "@playwright/test";
import type { Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

/** With LF_SHOTS=<folder>, the page at desktop, tablet and phone size (for looking at, not asserting). */
async function screenshots(page: Page, name: string) {
  const dir = process.env.LF_SHOTS;
  if (!dir) return;
  const before = page.viewportSize();
  for (const [w, h, tag] of [[1366, 850, "desktop"], [1024, 768, "tablet"], [390, 844, "phone"]] as const) {
    await page.setViewportSize({ width: w, height: h });
    await page.waitForTimeout(300);
    await page.screenshot({ path: `${dir}/${name}-${tag}.png` });
  }
  if (before) await page.setViewportSize(before);
}

// Done-when of clip ingest: a coach uploads a lab clip stored at 30 fps, confirms that the camera
// captured at 3,200 fps, watches the extraction bar, and opens frame 1.

function makeClip() {
  const file = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-e2e-")), "lab-camera-take-7.mp4");
  execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", "-f", "lavfi", "-i", "testsrc2=size=640x360:rate=30",
    "-frames:v", "240", "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", file]);
  return file;
}

test("a coach uploads a 3,200 fps clip stored at 30 fps, confirms the rate, watches the bar and opens frame 1", async ({ page }) => {
  const file = makeClip();
  await signIn(page, "coach@ravens.example");
  await page.goto("/clips");
  await page.getByTestId("clip-file-input").setInputFiles(file);

  const item = page.getByRole("listitem", { name: "Upload of lab-camera-take-7.mp4" });
  await item.getByLabel("Player").selectOption({ label: "Theo Marchetti" });
  await item.getByLabel("Shot type").selectOption("slap");
  await item.getByLabel("Venue").fill("Lakeport Arena, lab corner");
  await item.getByLabel("Drill").fill("Slap shots, lab camera");
  await item.getByRole("button", { name: "Upload" }).click();

  // The server probed the file: stored at 30 fps looks like a playback rate, so it asks.
  await expect(item.getByText("Stored", { exact: true })).toBeVisible();
  await expect(item.getByText("The file is stored at 30 fps.", { exact: false })).toBeVisible();
  const confirm = item.getByText("Confirm the capture rate").locator("..");
  await confirm.getByLabel("Capture rate (fps)").fill("3200");
  await confirm.getByRole("button", { name: "Confirm capture rate" }).click();
  await expect(page.getByText("Capture rate set to 3,200 fps.")).toBeVisible();

  const bar = item.getByRole("progressbar");
  await expect(bar).toBeVisible();
  await expect(bar).toHaveAttribute("aria-valuenow", "100", { timeout: 30_000 });
  await expect(item.getByText("All frames ready")).toBeVisible();

  // The library row shows both rates.
  const row = page.locator("tr", { hasText: "lab-camera-take-7" });
  await expect(row).toContainText("3,200 fps");
  await expect(row).toContainText("stored 30 fps");
  await expect(row).toContainText("240");

  await item.getByRole("link", { name: "Open clip" }).click();
  await expect(page.getByRole("heading", { name: "lab-camera-take-7" })).toBeVisible();
  await expect(page.getByText("3,200 fps", { exact: true })).toBeVisible();
  await expect(page.getByText("(confirmed)")).toBeVisible();
  await page.getByRole("button", { name: "Next frame" }).click();
  await page.getByRole("button", { name: "Open frame 1" }).click();
  const frame = page.getByTestId("frame-image");
  await expect(frame).toHaveAttribute("data-frame", "1");
  await expect(frame).toHaveAttribute("data-width", "640");
  await expect(page.getByLabel("Frame number")).toHaveValue("1");
});

test("thirty quick arrow presses on the Clip page move exactly thirty frames, and the frame box can be cleared and typed into", async ({ page }) => {
  await signIn(page, "coach@ravens.example");
  await page.goto("/clips");
  await page.getByRole("link", { name: "Slap shots, lane 1 — Theo" }).click();
  const box = page.getByLabel("Frame number");
  await expect(box).toHaveValue("1");
  await page.locator("#frame-viewer").focus();
  // Sent back to back, without waiting for the page to paint between presses.
  await page.locator("#frame-viewer").evaluate((el) => {
    for (let i = 0; i < 30; i++) el.dispatchEvent(new KeyboardEvent("keydown", { key: "ArrowRight", bubbles: true, cancelable: true }));
  });
  await expect(box).toHaveValue("31");
  await expect(page.getByTestId("frame-image")).toHaveAttribute("data-frame", "31");
  await page.keyboard.press("Shift+ArrowLeft");
  await expect(box).toHaveValue("21");

  await box.fill("");
  await expect(box).toHaveValue("");
  await box.pressSequentially("120");
  await box.press("Enter");
  await expect(box).toHaveValue("120");
  await expect(page.getByTestId("frame-image")).toHaveAttribute("data-frame", "120");
  await expect(page).toHaveURL(/frame=120/);
});

test("a clip's delete dialog says how many frames, shots and marks go with it, counted by the server", async ({ page }) => {
  await signIn(page, "coach@ravens.example");
  await page.goto("/clips");
  await page.getByRole("link", { name: "Slap shots, lane 1 — Theo" }).click();
  // The counts are the ones the dialog itself asked the server for when it opened.
  const asked = page.waitForResponse((r) => r.url().endsWith("/deletion") && r.request().method() === "GET");
  await page.getByRole("button", { name: "Delete" }).click();
  const dialog = page.getByRole("dialog", { name: "Delete this clip?" });
  const answer = await asked;
  expect(answer.status(), await answer.text()).toBe(200);
  const counts = (await answer.json()) as { frames: number; shots: number; marks: number };
  expect(counts.shots).toBeGreaterThan(0);
  const n = (k: number) => k.toLocaleString("en-US");
  await expect(dialog).toContainText(`its ${n(counts.frames)} frames, ${n(counts.shots)} shot${counts.shots === 1 ? "" : "s"} and their ${n(counts.marks)} marks`);
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(dialog).toHaveCount(0);
});

test("a folder of numbered lab frames goes up as one ZIP: the capture rate is asked for, then every frame is extracted", async ({ page }) => {
  const dir = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-e2e-")), "lab-run-12");
  mkdirSync(dir);
  execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", "-f", "lavfi", "-i", "testsrc2=size=320x240:rate=25",
    "-frames:v", "24", path.join(dir, "run12_%05d.png")]);
  writeFileSync(path.join(dir, "camera-settings.txt"), "shutter 1/20000");
  await signIn(page, "coach@ravens.example");
  await page.goto("/clips");
  await page.getByTestId("clip-folder-input").setInputFiles(dir);

  const item = page.getByRole("listitem", { name: "Upload of lab-run-12.zip" });
  await expect(item.getByText("Image sequence")).toBeVisible();
  await expect(item.getByText("24 frames", { exact: false })).toBeVisible();
  await item.getByLabel("Player").selectOption({ label: "Theo Marchetti" });
  await item.getByLabel("Shot type").selectOption("slap");
  await item.getByLabel("Venue").fill("Lakeport Arena, lab corner");
  await item.getByRole("button", { name: "Upload" }).click();
  await expect(item.getByText("Type the rate the camera recorded at", { exact: false })).toBeVisible();
  await item.getByLabel("Capture frame rate (fps)").fill("2000");
  await item.getByRole("button", { name: "Upload" }).click();

  await expect(item.getByText("Stored", { exact: true })).toBeVisible({ timeout: 30_000 });
  await expect(item.getByText("captured at 2,000 fps", { exact: false })).toBeVisible();
  await expect(item.getByRole("progressbar")).toHaveAttribute("aria-valuenow", "100", { timeout: 30_000 });
  const row = page.locator("tr", { hasText: "lab-run-12" });
  await expect(row).toContainText("2,000 fps");
  await expect(row).toContainText("24");
});

test("a clip with dropped frames: the Clip page names the gap and the Digitise strip marks where it is", async ({ page }) => {
  const file = path.join(mkdtempSync(path.join(os.tmpdir(), "lf-e2e-")), "dropped-240.mp4");
  execFileSync("ffmpeg", ["-hide_banner", "-loglevel", "error", "-nostdin", "-y", "-f", "lavfi", "-i", "testsrc2=size=640x360:rate=240:duration=1",
    "-vf", "select='not(between(n,100,102))'", "-fps_mode", "passthrough", "-c:v", "libx264", "-preset", "ultrafast", "-pix_fmt", "yuv420p", file]);
  await signIn(page, "coach@ravens.example");
  await page.goto("/clips");
  await page.getByTestId("clip-file-input").setInputFiles(file);
  const item = page.getByRole("listitem", { name: "Upload of dropped-240.mp4" });
  await item.getByLabel("Player").selectOption({ label: "Theo Marchetti" });
  await item.getByLabel("Shot type").selectOption("slap");
  await item.getByRole("button", { name: "Upload" }).click();
  await expect(item.getByRole("progressbar")).toHaveAttribute("aria-valuenow", "100", { timeout: 30_000 });
  await item.getByRole("link", { name: "Open clip" }).click();

  const warning = page.getByTestId("timing-irregularities");
  await expect(warning).toContainText("After frame 100: about 3 frames missing");
  await screenshots(page, "gap-clip");

  const clipId = page.url().split("/clips/")[1].split(/[/?]/)[0];
  const me = await (await page.request.get("/api/me")).json();
  const teamId: string = me.activeTeamId ?? me.teams[0].id;
  const r = await page.request.post(`/api/teams/${teamId}/clips/${clipId}/shots`, { data: { frameStart: 80, frameEnd: 130, label: "Across the gap" } });
  expect(r.status()).toBe(201);
  const shot = await r.json();
  await page.goto(`/clips/${clipId}/shots/${shot.id}/digitise`);
  const mark = page.getByTestId("strip-timing-mark");
  await expect(mark).toHaveCount(1);
  await expect(mark).toHaveAttribute("aria-label", /between frames 100 and 101 \(about 3 frames missing\)/);
  await screenshots(page, "gap-digitise");
});
