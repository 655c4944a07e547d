import { afterEach, describe, expect, it, vi } from "vitest";
import { api, ApiError } from "@/lib/api";

// The client's fetch wrapper turns every failure into one ApiError shape. Bodies below follow
// RFC 9457 (problem+json) and better-auth's own { code, message } error body [CP].

const respond = (status: number, body: unknown, type = "application/problem+json") =>
  vi.spyOn(globalThis, "fetch").mockResolvedValue(
    new Response(body === undefined ? null : typeof body === "string" ? body : JSON.stringify(body), { status, headers: { "content-type": type } }),
  );

afterEach(() => vi.restoreAllMocks());

/** The rejection of a call that must fail; a success fails the test. */
const failure = (p: Promise<unknown>) =>
  p.then(
    () => {
      throw new Error("expected the call to fail");
    },
    (x) => x as ApiError,
  );

describe("api()", () => {
  it("reads status, code, detail and field errors from problem+json", async () => {
    respond(422, { type: "about:blank", title: "Invalid input", status: 422, code: "validation_failed", detail: "email: Enter a valid e-mail address", errors: [{ path: "email", message: "Enter a valid e-mail address" }] });
    const e = await failure(api("/teams/t/invitations", { body: { email: "x" } }));
    expect(e).toBeInstanceOf(ApiError);
    expect(e).toMatchObject({ status: 422, code: "validation_failed", detail: "email: Enter a valid e-mail address" });
    expect(e.errors).toEqual([{ path: "email", message: "Enter a valid e-mail address" }]);
  });

  it("accepts better-auth's { code, message } body and lower-cases the code", async () => {
    respond(401, { code: "INVALID_EMAIL_OR_PASSWORD", message: "Invalid email or password" }, "application/json");
    const e = await failure(api("/auth/sign-in/email", { body: {} }));
    expect(e).toMatchObject({ status: 401, code: "invalid_email_or_password", detail: "Invalid email or password" });
  });

  it("gives a readable message when a proxy answers with HTML", async () => {
    respond(502, "<html>Bad gateway</html>", "text/html");
    const e = await failure(api("/me"));
    expect(e).toMatchObject({ status: 502, code: "server_error" });
    expect(e.detail).toMatch(/server/i);
  });

  it("names a network failure apart from a server answer", async () => {
    vi.spyOn(globalThis, "fetch").mockRejectedValue(new TypeError("fetch failed"));
    const e = await failure(api("/me"));
    expect(e).toMatchObject({ status: 0, code: "network_error" });
  });

  it("sends JSON same-origin under /api and returns undefined for 204", async () => {
    const f = respond(204, undefined);
    await expect(api("/teams/t/members/m", { method: "DELETE" })).resolves.toBeUndefined();
    const [url, init] = f.mock.calls[0]!;
    expect(url).toBe("/api/teams/t/members/m");
    expect(init).toMatchObject({ method: "DELETE", credentials: "same-origin", body: "{}" });
  });

  it("drops empty query values and encodes the rest", async () => {
    const f = respond(200, { ok: true }, "application/json");
    await expect(api("/clips", { query: { q: "a b", page: 2, none: undefined, nil: null } })).resolves.toEqual({ ok: true });
    expect(f.mock.calls[0]![0]).toBe("/api/clips?q=a+b&page=2");
  });
});
