import { expect, test, type Page } from "@playwright/test";
import { DEMO_PASSWORD, DEMO_SECOND_TEAM, DEMO_TEAM, demoPeople } from "../../server/seed/demo-people";

// The client shell against the real server and its seeded demo club: session guard, sign-in
// messages, team switcher, units preference, role-dependent navigation, sign-out.

const person = (role: string) => demoPeople.find((p) => p.role === role)!;

async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

async function switchTeam(page: Page, name: string) {
  await page.getByRole("button", { name: /Switch team/ }).click();
  // An item reads "<team> <role>"; anchor both ends so "Ravens" does not also match "Ravens U16".
  await page.getByRole("menuitemradio", { name: new RegExp(`^${name} (Team admin|Coach|Analyst|Player)$`) }).click();
  await expect(page.getByRole("button", { name: new RegExp(`Team: ${name} ?,`) })).toBeVisible();
}

test("a signed-out visit goes to sign-in, shows the server's message for a wrong password, then returns to the page", async ({ page }) => {
  await page.goto("/roster");
  await expect(page).toHaveURL(/\/sign-in\?next=%2Froster$/);

  await signIn(page, person("admin").email, "not-the-password");
  const alert = page.getByRole("alert").filter({ hasText: /password/i });
  await expect(alert).toBeVisible();
  await expect(page).toHaveURL(/\/sign-in/);

  await signIn(page, "nobody-here@ravens.example");
  await expect(alert).toBeVisible();

  await signIn(page, person("admin").email);
  await expect(page).toHaveURL(/\/roster$/);
  await expect(page.getByRole("heading", { name: "Members" })).toBeVisible();
});

test("sign-in: leaving the empty e-mail field for a link below it moves nothing, so the first click follows the link", async ({ page }) => {
  await page.goto("/sign-in");
  await expect(page.getByLabel("E-mail")).toBeFocused();
  const link = page.getByRole("link", { name: "Forgot password?" });
  const before = await link.boundingBox();
  // A real click: pointer down blurs the field, pointer up must land on the same link.
  await link.click();
  await expect(page).toHaveURL(/\/forgot-password/);
  await page.goBack();
  await page.getByLabel("E-mail").focus();
  await page.getByLabel("Password").focus();
  expect(await link.boundingBox()).toEqual(before);
  // Judged on submit: the message then says what is missing.
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByText(/e-mail/i).and(page.locator("[id$=-error]"))).toBeVisible();
});

test("the team switcher lists every team with its role and switching changes what the pages show", async ({ page }) => {
  const admin = person("admin");
  await page.goto("/sign-in");
  await signIn(page, admin.email);
  await page.getByRole("button", { name: /Switch team/ }).click();
  const items = page.getByRole("menuitemradio");
  await expect(items).toHaveCount(2);
  await expect(items.filter({ hasText: DEMO_TEAM.name }).first()).toHaveAttribute("aria-checked", "true");
  await expect(items.filter({ hasText: "Team admin" })).toHaveCount(2);
  await page.keyboard.press("Escape");

  // The analyst belongs to the first team only, so the second team's roster must not list them.
  const onlyFirst = demoPeople.find((p) => !p.alsoU16)!;
  await page.goto("/roster");
  await expect(page.getByRole("cell", { name: new RegExp(onlyFirst.email) })).toBeVisible();
  await switchTeam(page, DEMO_SECOND_TEAM.name);
  await expect(page.getByText(`people in ${DEMO_SECOND_TEAM.name}`)).toBeVisible();
  await expect(page.getByRole("cell", { name: new RegExp(onlyFirst.email) })).toHaveCount(0);

  // The choice is kept by the server, not just this tab.
  await page.reload();
  await expect(page.getByRole("button", { name: new RegExp(`Team: ${DEMO_SECOND_TEAM.name} ?,`) })).toBeVisible();
  await switchTeam(page, DEMO_TEAM.name);
});

test("the units choice is saved and survives a reload", async ({ page }) => {
  await page.goto("/sign-in");
  await signIn(page, person("coach").email);
  await page.getByRole("button", { name: /Account:/ }).click();
  await page.getByRole("menuitemradio", { name: /Imperial/ }).click();
  await expect(page.getByRole("menuitemradio", { name: /Imperial/ })).toHaveAttribute("aria-checked", "true");

  await page.reload();
  await page.getByRole("button", { name: /Account:/ }).click();
  await expect(page.getByRole("menuitemradio", { name: /Imperial/ })).toHaveAttribute("aria-checked", "true");
  await page.getByRole("menuitemradio", { name: /Metric/ }).click();
  await expect(page.getByRole("menuitemradio", { name: /Metric/ })).toHaveAttribute("aria-checked", "true");
});

test("a player sees no Roster link and a plain explanation if they open it anyway", async ({ page }) => {
  await page.goto("/sign-in");
  await signIn(page, person("player").email);
  const nav = page.getByRole("navigation", { name: "Areas" });
  await expect(nav.getByRole("link", { name: "Clips" })).toBeVisible();
  await expect(nav.getByRole("link", { name: "Roster" })).toHaveCount(0);
  await page.goto("/roster");
  await expect(page.getByText("The roster is kept by team admins")).toBeVisible();
});

test("signing out ends the session: signed-in pages send back to sign-in", async ({ page }) => {
  await page.goto("/sign-in");
  await signIn(page, person("analyst").email);
  await expect(page.getByRole("heading", { name: /Welcome back/ })).toBeVisible();
  await page.getByRole("button", { name: /Account:/ }).click();
  await page.getByRole("menuitem", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in$/);
  await page.goto("/progress");
  await expect(page).toHaveURL(/\/sign-in\?next=%2Fprogress$/);
});

test("an unknown invitation link says so instead of showing a form", async ({ page }) => {
  await page.goto("/invite/not-a-real-invitation");
  await expect(page.getByRole("heading", { name: "This invitation link isn't valid" })).toBeVisible();
  await expect(page.getByLabel("Password")).toHaveCount(0);
});

test("a tab left open across an update says so under the top bar, and one click reloads it", async ({ page }) => {
  await page.goto("/sign-in");
  await signIn(page, person("coach").email);
  await expect(page.getByRole("button", { name: /Account:/ })).toBeVisible(); // signed in, in the app's layout
  // The server names the page build it serves on /api/me: the entry script this tab was loaded with.
  const me = await page.request.get("/api/me");
  const entry = await page.locator('script[type="module"][src^="/assets/"]').getAttribute("src");
  expect(entry).toMatch(/^\/assets\/index-[\w-]+\.js$/);
  expect(me.status()).toBe(200);
  expect(me.headers()["x-client-build"]).toBe(entry);
  await expect(page.getByText("Loadframe has been updated")).toHaveCount(0);

  // The server now serves a newer build than this tab's (as after a deploy): the next /api/me says so.
  await page.route("**/api/me", async (route) => {
    const r = await route.fetch();
    await route.fulfill({ response: r, headers: { ...r.headers(), "x-client-build": "/assets/index-newer.js" } });
  });
  await page.reload();
  const banner = page.getByRole("status").filter({ hasText: "Loadframe has been updated" });
  await expect(banner).toBeVisible();
  await page.unroute("**/api/me");
  await banner.getByRole("button", { name: "Reload" }).click();
  await expect(page.getByRole("button", { name: /Account:/ })).toBeVisible();
  await expect(page.getByText("Loadframe has been updated")).toHaveCount(0);
});

test("a page of the old build that the server no longer has shows the same notice", async ({ page }) => {
  await page.goto("/sign-in");
  await signIn(page, person("coach").email);
  await expect(page.getByRole("button", { name: /Account:/ })).toBeVisible(); // signed in, in the app's layout
  // After a deploy the old build's lazily loaded pages are gone: the Stick lab's list here.
  await page.route(/\/assets\/SticksPage-[^/]*\.js$/, (route) => route.fulfill({ status: 404, body: "" }));
  await page.getByRole("navigation", { name: "Areas" }).getByRole("link", { name: "Stick lab" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Loadframe has been updated" })).toBeVisible();
});
