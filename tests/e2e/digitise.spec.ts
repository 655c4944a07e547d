import { expect, test, type Page } from "@playwright/test";
import { findPuck, getJson, puckAt, secondServer, signIn, theoClip } from "./digitise-support";

// The Digitise page in Debian's Chromium on the seeded demo club. The demo clips are synthetic
// scenes whose puck positions are known to the pixel (scripts/demo/shot-scene.ts), so a click is
// checked against the truth: the test finds the puck in a screenshot of the canvas, clicks it
// while zoomed and panned, and compares what the server stored.

const ANALYST = "analyst@ravens.example";

async function newShot(page: Page, base: string, frames: [number, number], label: string) {
  const { teamId, clipId, truth } = await theoClip(page, base);
  const r = await page.request.post(`${base}/api/teams/${teamId}/clips/${clipId}/shots`, { data: { frameStart: frames[0], frameEnd: frames[1], label } });
  expect(r.status(), await r.text()).toBe(201);
  const shot = await r.json();
  return { teamId, clipId, truth, shotId: shot.id as string, url: `${base}/clips/${clipId}/shots/${shot.id}/digitise` };
}

const viewer = (page: Page) => page.getByTestId("frame-viewer");

/** Open a shot on a frame and wait until the page answers keys. */
async function open(page: Page, url: string, frame: number) {
  await page.goto(`${url}?frame=${frame}`);
  await expect(page.getByTestId("hud-frame")).toHaveText(`Frame ${frame}`);
  await expect(viewer(page)).toHaveAttribute("data-frame", String(frame));
}
const saved = (page: Page) => expect(page.getByTestId("save-indicator")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });

/** Screenshot the canvas, find the puck, click its centre; returns where it clicked on the stage. */
async function clickPuck(page: Page, frame: number) {
  await expect(viewer(page)).toHaveAttribute("data-frame", String(frame));
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  const box = (await viewer(page).boundingBox())!;
  const [x, y] = await findPuck(await viewer(page).screenshot());
  await page.mouse.click(box.x + x, box.y + y);
  return [x, y];
}

async function storedPuck(page: Page, base: string, teamId: string, shotId: string) {
  return (await getJson(page, `${base}/api/teams/${teamId}/shots/${shotId}`)).marks.puck ?? [];
}

test("marks placed while zoomed and panned land on the puck's true pixel (within 0.5 px)", async ({ page }) => {
  await signIn(page, ANALYST);
  // Flight frames of shot 1: the puck moves several pixels a frame.
  const s = await newShot(page, "", [190, 240], "Zoom and pan check");
  await open(page, s.url, 200);

  // Zoom in on the puck with the wheel, then pan with a drag on empty picture.
  const box = (await viewer(page).boundingBox())!;
  const [px, py] = await findPuck(await viewer(page).screenshot());
  await page.mouse.move(box.x + px, box.y + py);
  for (let i = 0; i < 6; i++) await page.mouse.wheel(0, -240);
  await page.mouse.move(box.x + 80, box.y + box.height - 90);
  await page.mouse.down();
  await page.mouse.move(box.x + 150, box.y + box.height - 130, { steps: 5 });
  await page.mouse.up();
  const zoom = Number((await page.getByTestId("hud-zoom").textContent())!.replace("%", "")) / 100;
  expect(zoom).toBeGreaterThan(2.5);

  // Auto-advance: each click places the puck and moves to the next frame.
  await page.keyboard.press("a");
  for (const f of [200, 201, 202]) await clickPuck(page, f);
  await saved(page);

  const marks = await storedPuck(page, "", s.teamId, s.shotId);
  expect(marks.map((m: number[]) => m[0])).toEqual([200, 201, 202]);
  for (const [f, x, y] of marks) {
    const [tx, ty] = puckAt(s.truth, f);
    expect(Math.hypot(x - tx, y - ty), `frame ${f}: stored (${x}, ${y}), true (${tx}, ${ty})`).toBeLessThan(0.5);
  }

  // A click off the picture is refused where it happens, and nothing is stored.
  await page.keyboard.press("f");
  const fitted = (await viewer(page).boundingBox())!;
  await page.mouse.click(fitted.x + 4, fitted.y + fitted.height / 2);
  await expect(page.getByTestId("viewer-notice")).toContainText("outside the frame");
  // Release before puck strike is refused too.
  await page.keyboard.press("p");
  await page.keyboard.press("ArrowLeft");
  await page.keyboard.press("r");
  await expect(page.getByTestId("viewer-notice")).toContainText("must come after puck strike");
  await saved(page);
  const after = await getJson(page, `/api/teams/${s.teamId}/shots/${s.shotId}`);
  expect(after.marks.puck).toHaveLength(3);
  expect(after.events).toEqual({ puckStrike: 203 });
});

test("an edit made just before a reload is kept and saved; undo and redo go through the autosave", async ({ page }) => {
  await signIn(page, ANALYST);
  const s = await newShot(page, "", [190, 240], "Reload check");
  await open(page, s.url, 205);
  await clickPuck(page, 205);
  // Reload at once: the debounced save has not gone yet, the local copy has.
  await page.reload();
  await expect(page.getByTestId("landmark-puck")).toHaveAttribute("data-count", "1");
  await saved(page);
  expect(await storedPuck(page, "", s.teamId, s.shotId)).toHaveLength(1);

  // Undo and redo are edits like any other: each one is saved.
  await page.keyboard.press("ArrowRight");
  await page.keyboard.press("a");
  await clickPuck(page, 206);
  await clickPuck(page, 207);
  await saved(page);
  expect((await storedPuck(page, "", s.teamId, s.shotId)).map((m: number[]) => m[0])).toEqual([205, 206, 207]);
  await page.keyboard.press("Control+z");
  await saved(page);
  expect((await storedPuck(page, "", s.teamId, s.shotId)).map((m: number[]) => m[0])).toEqual([205, 206]);
  await page.keyboard.press("Control+Shift+z");
  await saved(page);
  expect((await storedPuck(page, "", s.teamId, s.shotId)).map((m: number[]) => m[0])).toEqual([205, 206, 207]);
});

test("with the server killed, edits wait in the browser and reach the server when it is back", async ({ page }) => {
  test.setTimeout(240_000); // two server starts of up to 90 s each on a busy machine
  const srv = await secondServer();
  await srv.start();
  try {
    await signIn(page, ANALYST, srv.base);
    const s = await newShot(page, srv.base, [190, 240], "Restart check");
    await open(page, s.url, 210);
    await page.keyboard.press("a");
    await clickPuck(page, 210);
    await saved(page);

    await srv.kill();
    await clickPuck(page, 211);
    await clickPuck(page, 212);
    await expect(page.getByTestId("save-indicator")).toHaveAttribute("data-state", "offline", { timeout: 10_000 });
    await expect(page.getByTestId("save-indicator")).toContainText("kept on this computer");

    await srv.start();
    await saved(page);
    const marks = await storedPuck(page, srv.base, s.teamId, s.shotId);
    expect(marks.map((m: number[]) => m[0])).toEqual([210, 211, 212]);
    await page.reload();
    await expect(page.getByTestId("landmark-puck")).toHaveAttribute("data-count", "3");
  } finally {
    await srv.kill();
  }
});

test("two people on one shot: the second save gets a conflict message, not a silent overwrite", async ({ browser }) => {
  const a = await (await browser.newContext()).newPage();
  const b = await (await browser.newContext()).newPage();
  await signIn(a, ANALYST);
  await signIn(b, "coach@ravens.example");
  const s = await newShot(a, "", [190, 240], "Conflict check");
  await open(a, s.url, 215);
  await open(b, s.url, 216);
  await clickPuck(a, 215);
  await saved(a);
  await clickPuck(b, 216);
  await expect(b.getByTestId("conflict-banner")).toContainText("Priya Lindqvist saved this shot");
  expect((await storedPuck(a, "", s.teamId, s.shotId)).map((m: number[]) => m[0])).toEqual([215]);
  await b.getByRole("button", { name: /Use theirs/ }).click();
  await saved(b);
  await expect(b.getByTestId("landmark-puck")).toHaveAttribute("data-count", "1");
});

/** The clip's shots page row of one shot: its puck count as the page shows it. */
const rowPuckCount = (page: Page, label: string) =>
  page.getByTestId("clip-shot-row").filter({ hasText: label }).locator("[title^='Puck: ']");

test("coming back to a shot within minutes shows the latest version, and the next edit saves without a conflict with oneself", async ({ page }) => {
  await signIn(page, ANALYST);
  const s = await newShot(page, "", [205, 240], "Come back check");
  const marksAnswers: number[] = [];
  page.on("response", (r) => {
    if (r.request().method() === "PUT" && r.url().endsWith("/marks")) marksAnswers.push(r.status());
  });
  // Everything below moves inside the app (links, no reload), so the page's cache lives on.
  await page.goto(`/clips/${s.clipId}/shots`);
  await expect(rowPuckCount(page, "Come back check")).toHaveAttribute("title", /^Puck: 0/);
  await page.getByRole("link", { name: "Come back check" }).click();
  await expect(page.getByTestId("hud-frame")).toHaveText("Frame 205");
  await clickPuck(page, 205);
  await saved(page);

  // Leave for the clip's shots: the list already counts the new mark (no 30 s of old numbers).
  await page.getByRole("navigation", { name: "Breadcrumb" }).getByRole("link").nth(1).click();
  await expect(rowPuckCount(page, "Come back check")).toHaveAttribute("title", /^Puck: 1/, { timeout: 3_000 });

  // Come back a few seconds later: the page starts from the saved version, not the first visit's.
  await page.getByRole("link", { name: "Come back check" }).click();
  await expect(page.getByTestId("landmark-puck")).toHaveAttribute("data-count", "1", { timeout: 3_000 });
  await page.keyboard.press("ArrowRight");
  await clickPuck(page, 206);
  await saved(page);
  await expect(page.getByTestId("conflict-banner")).toHaveCount(0);
  expect((await storedPuck(page, "", s.teamId, s.shotId)).map((m: number[]) => m[0])).toEqual([205, 206]);
  expect(marksAnswers.length).toBeGreaterThan(0);
  expect(marksAnswers).not.toContain(409);
});

test("deleting a shot takes it off the Shots list at once, not 30 s later", async ({ page }) => {
  await signIn(page, ANALYST);
  const s = await newShot(page, "", [190, 240], "Delete check");
  const shotsLink = page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Shots", exact: true });
  const total = page.getByText(/^[\d,]+ shots?$/);
  // Moves inside the app only (links and history), so the Shots list's cached page lives on.
  await page.goto(`/clips/${s.clipId}/shots`);
  await shotsLink.click();
  await expect(total).toBeVisible();
  const before = Number((await total.textContent())!.replace(/\D/g, ""));
  await page.goBack();
  await page.getByTestId("clip-shot-row").filter({ hasText: "Delete check" }).getByRole("button", { name: "Delete" }).click();
  await page.getByRole("button", { name: "Delete shot" }).click();
  await expect(page.getByTestId("clip-shot-row").filter({ hasText: "Delete check" })).toHaveCount(0);
  await shotsLink.click();
  await expect(total).toHaveText(`${(before - 1).toLocaleString("en")} shot${before - 1 === 1 ? "" : "s"}`, { timeout: 3_000 });
});

test("two people on different landmarks: both edits are kept, merged per landmark, and the page says so", async ({ browser }) => {
  const a = await (await browser.newContext()).newPage();
  const b = await (await browser.newContext()).newPage();
  await signIn(a, ANALYST);
  await signIn(b, "coach@ravens.example");
  const s = await newShot(a, "", [190, 240], "Merge check");
  await open(a, s.url, 215);
  await open(b, s.url, 216);
  await clickPuck(a, 215);
  await saved(a);
  // The coach sets puck strike on frame 216 meanwhile: another part of the shot.
  await b.keyboard.press("p");
  await saved(b);
  await expect(b.getByTestId("conflict-banner")).toHaveCount(0);
  await expect(b.getByText(/Priya Lindqvist's puck kept with your edits/)).toBeVisible();
  await expect(b.getByTestId("landmark-puck")).toHaveAttribute("data-count", "1");
  const stored = await getJson(a, `/api/teams/${s.teamId}/shots/${s.shotId}`);
  expect(stored.marks.puck.map((m: number[]) => m[0])).toEqual([215]);
  expect(stored.events).toEqual({ puckStrike: 216 });
});

test("a player sees their shot read-only", async ({ page }) => {
  await signIn(page, ANALYST);
  const { teamId, clipId } = await theoClip(page);
  const list = await getJson(page, `/api/teams/${teamId}/clips/${clipId}/shots`);
  const shot = list.shots.find((x: { label: string }) => x.label === "Slap shot 1");
  await page.context().clearCookies();

  await signIn(page, "player@ravens.example");
  await page.goto(`/clips/${clipId}/shots/${shot.id}/digitise?frame=150`);
  await expect(page.getByTestId("save-indicator")).toHaveText(/Read-only/);
  const before = await getJson(page, `/api/teams/${teamId}/shots/${shot.id}`);
  const box = (await viewer(page).boundingBox())!;
  await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
  await page.keyboard.press("r");
  await page.keyboard.press("Delete");
  await expect(page.getByRole("button", { name: /Set here/ })).toHaveCount(0);
  await page.keyboard.press("ArrowRight");
  await expect(page.getByTestId("hud-frame")).toHaveText("Frame 151");
  const after = await getJson(page, `/api/teams/${teamId}/shots/${shot.id}`);
  expect(after.version).toBe(before.version);
  expect(after.marks).toEqual(before.marks);
  const put = await page.request.put(`/api/teams/${teamId}/shots/${shot.id}/marks`, { data: { baseVersion: after.version, marks: {}, events: {} } });
  expect(put.status()).toBe(403);
});
