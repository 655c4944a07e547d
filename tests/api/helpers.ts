// Real HTTP against the real app on an ephemeral loopback port, with a cookie jar per person.
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll } from "vitest";
import type { Server } from "node:http";
import { createApp } from "../../server/app";
import { createWebServer } from "../../server/http/web-server";
import { seedPeople, DEMO_PASSWORD, type DemoIds } from "../../server/seed/demo-people";

export interface TestServer { url: string; close: () => Promise<void> }

export async function startServer(): Promise<TestServer> {
  process.env.PUBLIC_URL ??= "http://127.0.0.1:3000";
  // The web process's own server, with its time limits (server/http/web-server.ts).
  const server: Server = createWebServer(createApp());
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise((r) => server.close(() => r())) };
}

export class Client {
  private cookies = new Map<string, string>();
  constructor(readonly base: string) {}

  async request(method: string, path: string, body?: unknown, init: RequestInit = {}) {
    const headers = new Headers(init.headers);
    headers.set("origin", "http://127.0.0.1:3000");
    if (body !== undefined && !(body instanceof FormData) && typeof body !== "string") headers.set("content-type", "application/json");
    if (this.cookies.size) headers.set("cookie", [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; "));
    const res = await fetch(this.base + path, {
      ...init,
      method,
      headers,
      body: body === undefined ? undefined : body instanceof FormData || typeof body === "string" ? body : JSON.stringify(body),
      redirect: "manual",
    });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      const k = pair.slice(0, i), v = pair.slice(i + 1);
      if (v === "" || /max-age=0/i.test(c)) this.cookies.delete(k);
      else this.cookies.set(k, v);
    }
    const text = await res.text();
    let json: any = undefined;
    try { json = text ? JSON.parse(text) : undefined; } catch { /* not JSON */ }
    return { status: res.status, json, text, headers: res.headers };
  }
  get = (p: string) => this.request("GET", p);
  post = (p: string, b?: unknown) => this.request("POST", p, b ?? {});
  put = (p: string, b?: unknown) => this.request("PUT", p, b ?? {});
  patch = (p: string, b?: unknown) => this.request("PATCH", p, b ?? {});
  del = (p: string) => this.request("DELETE", p);

  async signIn(email: string, password = DEMO_PASSWORD) {
    const r = await this.post("/api/auth/sign-in/email", { email, password });
    if (r.status !== 200) throw new Error(`sign-in failed for ${email}: ${r.status} ${r.text}`);
    return this;
  }
}

export const EMAILS = {
  admin: "admin@ravens.example",
  coach: "coach@ravens.example",
  analyst: "analyst@ravens.example",
  player: "player@ravens.example",
  player2: "player2@ravens.example",
} as const;

/** The demo people plus an outsider who belongs only to a second, unrelated team. */
export async function seedWorld(): Promise<DemoIds & { outsiderEmail: string; otherTeamId: string }> {
  const ids = await seedPeople();
  const { db } = await import("../../server/db/client");
  const { organization, member } = await import("../../server/db/schema");
  const { createAccount } = await import("../../server/auth/accounts");
  const outsiderEmail = "outsider@elsewhere.example";
  const { userId } = await createAccount({ email: outsiderEmail, password: DEMO_PASSWORD, name: "Casey Outsider", emailVerified: true, signIn: false });
  const otherTeamId = crypto.randomUUID();
  await db().insert(organization).values({ id: otherTeamId, name: "Riverside Foxes", slug: "riverside-foxes", createdAt: new Date() });
  await db().insert(member).values({ id: crypto.randomUUID(), organizationId: otherTeamId, userId, role: "admin", createdAt: new Date() });
  return { ...ids, outsiderEmail, otherTeamId };
}

/** An API test file's usual setting: the in-process server and the demo world, with one person signed in. */
export function useWorld(email: string = EMAILS.admin) {
  const w = {} as { srv: TestServer; world: Awaited<ReturnType<typeof seedWorld>>; signedIn: Client };
  beforeAll(async () => {
    w.srv = await startServer();
    w.world = await seedWorld();
    w.signedIn = await new Client(w.srv.url).signIn(email);
  });
  afterAll(() => w.srv.close());
  return w;
}

/** Messages the dev mail sink (maildev) received for an address, newest last. */
export async function mailsTo(address: string): Promise<{ subject: string; text: string; html: string }[]> {
  const inbox = process.env.MAIL_INBOX_URL!;
  const all = (await (await fetch(`${inbox}/api/email`)).json()) as { subject: string; text: string; html: string; to: { address: string }[] }[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** The newest mail to `address` whose subject matches (and whose text holds `containing`, when given:
 * test files run in parallel against one mail sink, so two may send the same subject). */
export async function waitForMail(address: string, match: RegExp, timeoutMs = 5000, containing?: string) {
  const t0 = Date.now();
  while (Date.now() - t0 < timeoutMs) {
    const m = (await mailsTo(address)).filter((x) => match.test(x.subject) && (!containing || x.text.includes(containing))).at(-1);
    if (m) return m;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${address} matching ${match} within ${timeoutMs} ms`);
}

export const linkIn = (text: string) => text.match(/https?:\/\/\S+/)?.[0] ?? "";
