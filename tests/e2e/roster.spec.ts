import { expect, test } from "@playwright/test";
import { demoPeople } from "../../server/seed/demo-people";
import { signIn } from "./support/sign-in";

// The foundation's promise end to end: a team admin invites a member by e-mail, the invitee
// opens the link from the real message in the mail sink, sets a password and lands in the team;
// a role change then takes effect for that member.

const inbox = process.env.TEST_INBOX_URL ?? "http://127.0.0.1:1180";
const admin = demoPeople.find((p) => p.role === "admin")!;

async function inviteLink(to: string): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const mails = (await (await fetch(`${inbox}/api/email`)).json()) as { to: { address: string }[]; text: string }[];
    const m = mails.filter((x) => x.to.some((t) => t.address === to)).at(-1);
    const url = m?.text.match(/https?:\/\/\S+\/invite\/\S+/)?.[0];
    if (url) return url;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no invitation mail for ${to}`);
}

test("invite a member, accept through the mailed link, and a role change takes effect", async ({ browser }) => {
  const email = `newcomer-${Date.now()}@ravens.example`;
  const adminCtx = await browser.newContext();
  const a = await adminCtx.newPage();
  await signIn(a, admin.email);
  await a.goto("/roster");
  const form = a.locator("form").filter({ has: a.getByRole("button", { name: "Send invitation" }) });
  await form.getByLabel("E-mail").fill(email);
  await form.getByLabel("Role", { exact: true }).selectOption("player");
  await form.getByRole("button", { name: "Send invitation" }).click();
  await expect(a.getByRole("cell", { name: email })).toBeVisible();

  const link = await inviteLink(email);
  const inviteeCtx = await browser.newContext();
  const b = await inviteeCtx.newPage();
  await b.goto(new URL(link).pathname);
  await expect(b.getByText("Lakeport Ravens").first()).toBeVisible();
  await b.getByLabel("Your name").fill("Sam Newcomer");
  await b.getByLabel("Password", { exact: true }).fill("newcomer-password");
  await b.getByLabel("Password again").fill("newcomer-password");
  await b.getByRole("button", { name: /join|create/i }).click();
  await expect(b).not.toHaveURL(/invite/);
  // a player has no Roster link
  await expect(b.getByRole("link", { name: "Roster" })).toHaveCount(0);

  // the admin sees the new member and makes them a coach
  await a.reload();
  const roleSelect = a.getByLabel("Role of Sam Newcomer");
  await expect(roleSelect).toHaveValue("player");
  await roleSelect.selectOption("coach");
  await expect(roleSelect).toHaveValue("coach");
  const confirm = a.getByRole("button", { name: /change role|confirm/i });
  if (await confirm.isVisible().catch(() => false)) await confirm.click();

  // the change takes effect for the member: the roster's members list now opens for them
  await expect
    .poll(async () => (await b.request.get("/api/me")).json().then((m) => m.teams[0].role), { timeout: 10_000 })
    .toBe("coach");
  const r = await b.request.get(`/api/teams/${(await (await b.request.get("/api/me")).json()).activeTeamId}/members`);
  expect(r.status()).toBe(200);
  await adminCtx.close();
  await inviteeCtx.close();
});
