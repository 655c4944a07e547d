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
