import { APIError } from "better-auth/api";
import { HttpError, PROBLEM_TYPE, problemJson } from "./problem";
import { isProblemCode, type ProblemCode } from "../../shared/schemas/problem-codes";

/**
 * better-auth answers its own errors as `{ code, message }` JSON (or plain text); the API speaks
 * problem+json everywhere, so its answers are rewritten here with the code in lower case.
 * Headers other than the body's type and length (cookies, Retry-After) are kept.
 */
export async function asProblemResponse(res: globalThis.Response): Promise<globalThis.Response> {
  if (res.status < 400 || (res.headers.get("content-type") ?? "").includes(PROBLEM_TYPE)) return res;
  const text = await res.text();
  let body: { code?: unknown; message?: unknown } = {};
  try {
    body = JSON.parse(text) as typeof body;
  } catch {
    body = { message: text };
  }
  const code = typeof body.code === "string" && body.code ? body.code.toLowerCase() : res.status === 404 ? "not_found" : "auth_error";
  const detail = typeof body.message === "string" && body.message.trim() ? body.message.trim() : res.statusText || "The request was refused.";
  const headers = new Headers(res.headers);
  headers.delete("content-length");
  headers.set("content-type", PROBLEM_TYPE);
  return new Response(problemJson(res.status, code, detail), { status: res.status, headers });
}

/** Run a better-auth server call and turn its APIError into our problem+json error. */
/** The library's code when it is one the API lists (shared/schemas/problem-codes.ts), else `fallback`. */
const listed = (code: unknown, fallback: ProblemCode): ProblemCode => {
  const c = typeof code === "string" ? code.toLowerCase() : "";
  return isProblemCode(c) ? c : fallback;
};

export async function viaAuth<T>(fn: () => Promise<T>, fallbackCode: ProblemCode = "auth_error"): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    if (e instanceof APIError) {
      const body = (e.body ?? {}) as { code?: string; message?: string };
      const status = typeof e.statusCode === "number" ? e.statusCode : 400;
      throw new HttpError(status, listed(body.code, fallbackCode), body.message ?? e.message);
    }
    throw e;
  }
}

/**
 * Cookies from several better-auth calls, the later ones winning by name. The session cookie
 * cache (server/auth/auth.ts) makes this matter: a call that changes the session (the active
 * team, a new sign-in) sends a new signed copy, and the browser must get the newest one.
 */
export function mergeSetCookies(...lists: string[][]): string[] {
  const byName = new Map<string, string>();
  for (const c of lists.flat()) byName.set(c.slice(0, c.indexOf("=")), c);
  return [...byName.values()];
}
