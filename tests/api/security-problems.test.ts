// Every error answer is problem+json with a stable code (issue group 8): the upload protocol's own
// refusals, the auth library's, and routes that do not exist.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, EMAILS, seedWorld, startServer, type TestServer } from "./helpers";

let srv: TestServer;
let coach: Client;
beforeAll(async () => {
  srv = await startServer();
  await seedWorld();
  coach = await new Client(srv.url).signIn(EMAILS.coach);
});
afterAll(() => srv.close());

async function expectProblem(r: Response, status: number, code: string) {
  expect(r.status).toBe(status);
  expect(r.headers.get("content-type")).toMatch(/^application\/problem\+json/);
  const body = await r.json();
  expect(body).toMatchObject({ status, code });
  expect(typeof body.detail).toBe("string");
}

describe("problem+json everywhere", () => {
  const up = (path: string, method: string, headers: Record<string, string>, body?: string) =>
    fetch(`${srv.url}/api/uploads${path}`, { method, headers: { origin: "http://127.0.0.1:3000", ...headers }, body });

  it("the upload protocol's own refusals", async () => {
    await expectProblem(await up("", "POST", { "upload-length": "10" }), 412, "tus_version_required");
    await expectProblem(await up("", "POST", { "tus-resumable": "1.0.0", "upload-length": "10", "upload-metadata": "teamId !!!" }), 400, "invalid_header");
    await expectProblem(await up("/no-such-upload", "PATCH", { "tus-resumable": "1.0.0", "upload-offset": "0", "content-type": "application/offset+octet-stream" }, "x"), 404, "not_found");
    await expectProblem(await up("", "GET", {}), 405, "method_not_allowed");
  });

  it("an offset conflict on a real upload", async () => {
    const { cookieOf } = await import("./clips-support");
    const cookie = cookieOf(coach);
    const teamId = (await coach.get("/api/me")).json.teams[0].id as string;
    const meta = JSON.stringify({ title: "", newSession: { date: "2026-03-14", venue: "", drill: "" }, shotType: "slap", cameraView: "side", playerId: (await coach.get(`/api/teams/${teamId}/clip-options`)).json.players[0].id });
    const b64 = (s: string) => Buffer.from(s).toString("base64");
    const made = await up("", "POST", { cookie, "tus-resumable": "1.0.0", "upload-length": "100", "upload-metadata": `teamId ${b64(teamId)},filename ${b64("a.mp4")},meta ${b64(meta)}` });
    expect(made.status, await made.clone().text()).toBe(201);
    const location = made.headers.get("location")!;
    const id = location.split("/").pop()!;
    await expectProblem(await up(`/${id}`, "PATCH", { cookie, "tus-resumable": "1.0.0", "upload-offset": "50", "content-type": "application/offset+octet-stream" }, "x"), 409, "offset_conflict");
    await up(`/${id}`, "DELETE", { cookie, "tus-resumable": "1.0.0" });
  });

  it("the auth library's refusals and unknown routes", async () => {
    const wrong = await fetch(`${srv.url}/api/auth/sign-in/email`, { method: "POST", headers: { "content-type": "application/json", origin: "http://127.0.0.1:3000" }, body: JSON.stringify({ email: EMAILS.coach, password: "not-the-password" }) });
    await expectProblem(wrong, 401, "invalid_email_or_password");
    await expectProblem(await fetch(`${srv.url}/api/auth/nothing-here`), 404, "not_found");
    await expectProblem(await fetch(`${srv.url}/api/nothing-here`), 404, "not_found");
    await expectProblem(await fetch(`${srv.url}/api/auth/sign-in/email`, { method: "POST", headers: { "content-type": "text/plain", origin: "http://127.0.0.1:3000" }, body: "email=x" }), 415, "unsupported_media_type");
  });
});
