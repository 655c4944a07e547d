import { expect, test } from "@playwright/test";
import { demoPeople } from "../../server/seed/demo-people";
import { signIn } from "./support/sign-in";

// The team admin reads who did what: an invitation and a role change show as sentences in the
// audit log, reached from the navigation; other roles have no link and an explanation instead.

const admin = demoPeople.find((p) => p.role === "admin")!;
const player = demoPeople.find((p) => p.role === "player")!;

test("a team admin reads invitations and role changes in the audit log", async ({ browser }) => {
  const ctx = await browser.newContext();
  const a = await ctx.newPage();
  await signIn(a, admin.email);
  const me = await (await a.request.get("/api/me")).json();
  const teamId = me.activeTeamId as string;
  const email = `audit-${Date.now()}@ravens.example`;
  expect((await a.request.post(`/api/teams/${teamId}/invitations`, { data: { email, role: "analyst" } })).status()).toBe(201);
  const members = (await (await a.request.get(`/api/teams/${teamId}/members`)).json()).members as { id: string; name: string; role: string }[];
  const target = members.find((m) => m.role === "player")!;
  expect((await a.request.patch(`/api/teams/${teamId}/members/${target.id}`, { data: { role: "analyst" } })).status()).toBe(200);
  expect((await a.request.patch(`/api/teams/${teamId}/members/${target.id}`, { data: { role: "player" } })).status()).toBe(200);

  await a.getByRole("link", { name: "Audit log" }).first().click();
  await expect(a.getByRole("heading", { name: "Audit log", level: 1 })).toBeVisible();
  const entries = a.getByRole("list", { name: "Audit log entries" });
  await expect(entries.getByText(`invited ${email} as analyst`)).toBeVisible();
  await expect(entries.getByText(`changed ${target.name}’s role from player to analyst`)).toBeVisible();
  await expect(entries.getByText(`changed ${target.name}’s role from analyst to player`)).toBeVisible();

  await a.getByLabel("Show entries of").selectOption("deletions");
  await expect(entries.getByText(`invited ${email} as analyst`)).toHaveCount(0);
  await a.getByLabel("Show entries of").selectOption("people");
  await expect(entries.getByText(`invited ${email} as analyst`)).toBeVisible();
  if (process.env.SCREENSHOT_DIR) await a.screenshot({ path: `${process.env.SCREENSHOT_DIR}/audit.png`, fullPage: true });
  await ctx.close();
});

test("other roles have no audit log link and are told who keeps it", async ({ page }) => {
  await signIn(page, player.email);
  await expect(page.getByRole("link", { name: "Audit log" })).toHaveCount(0);
  await page.goto("/audit");
  await expect(page.getByText("The audit log is for team admins")).toBeVisible();
});
