// The README's club-network set-up: PUBLIC_URL on plain http under a name that is not loopback.
// Chromium treats 127.0.0.1 and localhost as secure and never upgrades them, so the page is opened
// as http://loadframe.club.lan:<port>, a name mapped to 127.0.0.1 (--host-resolver-rules). Before
// the fix, every answer carried upgrade-insecure-requests and the page stayed blank.
import { spawn, type ChildProcess } from "node:child_process";
import { createServer } from "node:net";
import { chromium, expect, test, type Browser } from "@playwright/test";
import { DEMO_PASSWORD } from "../../server/seed/demo-people";
import config from "../../playwright.config";

const HOST = "loadframe.club.lan";
let server: ChildProcess | undefined;
let browser: Browser | undefined;
let base = "";

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });

test.beforeAll(async () => {
  test.setTimeout(180_000);
  const port = await freePort();
  base = `http://${HOST}:${port}`;
  server = spawn("bash", ["tests/e2e/serve.sh", String(port)], { env: { ...process.env, E2E_PUBLIC_URL: base }, stdio: "ignore", detached: true });
  for (let i = 0; i < 600; i++) {
    if (await fetch(`http://127.0.0.1:${port}/api/health`).then((r) => r.ok, () => false)) break;
    await new Promise((r) => setTimeout(r, 250));
  }
  const launch = config.use?.launchOptions ?? {};
  browser = await chromium.launch({ ...launch, args: [...(launch.args ?? []), `--host-resolver-rules=MAP ${HOST} 127.0.0.1`] });
});

test.afterAll(async () => {
  await browser?.close();
  if (server?.pid) process.kill(-server.pid, "SIGTERM");
});

test("on a club's plain-http network the app loads, signs in and stays on http", async () => {
  const page = await browser!.newPage();
  const https: string[] = [];
  page.on("request", (r) => void (r.url().startsWith("https:") && https.push(r.url())));
  const res = await page.goto(`${base}/sign-in`);
  expect(res?.headers()["content-security-policy"]).not.toContain("upgrade-insecure-requests");
  expect(res?.headers()["strict-transport-security"]).toBeUndefined();
  await page.getByLabel("E-mail").fill("coach@ravens.example");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).not.toHaveURL(/sign-in/);
  await expect(page.getByRole("navigation").first()).toBeVisible();
  expect(https).toEqual([]);
});
