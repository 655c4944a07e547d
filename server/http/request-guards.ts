// Cheap checks on every API request, before any route reads a parameter.
import type { Request, Response } from "express";
import { sendProblem } from "./problem";

// A percent-encoded C0 control or DEL (%00–%1F, %7F) in the path or query: no id or filter we
// have can contain one, and PostgreSQL refuses NUL in text with an error rather than a miss.
// (Raw control characters never get this far: Node's HTTP parser refuses them.)
const ENCODED_CONTROL = /%(?:[01][0-9a-f]|7f)/i;

/** Refuses a percent-encoded control character with 400 problem+json `invalid_url`; true when it answered. */
export function refuseControlCharactersInUrl(req: Request, res: Response): boolean {
  if (!ENCODED_CONTROL.test(req.originalUrl)) return false;
  sendProblem(res, 400, "invalid_url", "The address contains a control character (such as %00), which no Loadframe address has.");
  return true;
}
