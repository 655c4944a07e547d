import { APIError } from "better-auth/api";
import { HttpError } from "./problem";

/** Run a better-auth server call and turn its APIError into our problem+json error. */
export async function viaAuth<T>(fn: () => Promise<T>, fallbackCode = "auth_error"): Promise<T> {
  try {
    return await fn();
  } catch (e) {
    if (e instanceof APIError) {
      const body = (e.body ?? {}) as { code?: string; message?: string };
      const status = typeof e.statusCode === "number" ? e.statusCode : 400;
      throw new HttpError(status, (body.code ?? fallbackCode).toLowerCase(), body.message ?? e.message);
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
