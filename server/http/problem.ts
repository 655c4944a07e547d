import type { ErrorRequestHandler, Response } from "express";
import { isDatabaseDown } from "./database-down";
import { ZodError } from "zod";
import { isProblemCode, type ProblemCode } from "../../shared/schemas/problem-codes";

/**
 * An error the API answers as problem+json (RFC 9457) with a stable machine `code`. `extra` holds
 * extension members (RFC 9457 §3.2) such as who saved a shot last; every answer is written by
 * `problemBody`, so there is one shape.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ProblemCode,
    message: string,
    readonly errors?: { path: string; message: string }[],
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

const titles: Record<number, string> = {
  400: "Bad request", 401: "Sign-in needed", 402: "Payment required", 403: "Not allowed", 404: "Not found", 405: "Method not allowed", 409: "Conflict",
  410: "Gone", 412: "Precondition failed", 413: "Too large", 415: "Unsupported media type", 416: "Range not satisfiable",
  422: "Invalid input", 429: "Too many requests", 460: "Checksum mismatch", 500: "Server error", 503: "Unavailable", 507: "Storage full",
};

export const notFound = (what = "That item") => new HttpError(404, "not_found", `${what} was not found, or you do not have access to it.`);
export const forbidden = (detail = "Your role in this team does not allow this.") => new HttpError(403, "forbidden", detail);
export const unauthenticated = () => new HttpError(401, "unauthenticated", "Please sign in to continue.");

export const PROBLEM_TYPE = "application/problem+json";

/** The problem+json document (RFC 9457) every error answer carries, upload and auth routes included. */
export function problemJson(status: number, code: string, detail: string, extra: Record<string, unknown> = {}): string {
  return JSON.stringify({ type: "about:blank", title: titles[status] ?? "Error", status, code, detail, ...extra });
}

/** The document for an HttpError: its field errors and extension members included. */
export const problemBody = (e: HttpError) => problemJson(e.status, e.code, e.message, { ...e.extra, ...(e.errors ? { errors: e.errors } : {}) });

export function sendProblem(res: Response, status: number, code: ProblemCode, detail: string, errors?: HttpError["errors"]) {
  res.status(status).type(PROBLEM_TYPE).send(problemJson(status, code, detail, errors ? { errors } : {}));
}

export function zodToHttp(err: ZodError): HttpError {
  const errors = err.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
  const first = errors[0];
  return new HttpError(422, "validation_failed", first ? (first.path ? `${first.path}: ${first.message}` : first.message) : "Invalid input", errors);
}

/** Last middleware: every thrown error becomes problem+json; unknown ones are logged, not shown. */
export const problemHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) {
    // Part of the answer (a stream, a file, events) is already out: it cannot turn into a problem
    // document. Cut the connection, so the client sees a broken answer instead of waiting on an
    // open one forever.
    req.log?.error({ err }, "error after the answer began; connection closed");
    res.destroy();
    return;
  }
  if (err instanceof HttpError) {
    if (err.status === 503) res.setHeader("Retry-After", "5");
    return res.status(err.status).type(PROBLEM_TYPE).send(problemBody(err));
  }
  if (err instanceof ZodError) {
    const h = zodToHttp(err);
    return sendProblem(res, h.status, h.code, h.message, h.errors);
  }
  // body-parser errors carry a `type` and a status
  if (err?.type === "entity.parse.failed") return sendProblem(res, 400, "malformed_json", "The request body is not valid JSON.");
  if (err?.type === "entity.too.large") return sendProblem(res, 413, "too_large", "The request body is too large.");
  if (typeof err?.status === "number" && err.status >= 400 && err.status < 500)
    return sendProblem(res, err.status, isProblemCode(err.code) ? err.code : "bad_request", err.message ?? "Bad request");
  if (isDatabaseDown(err)) {
    req.log?.warn({ err }, "database unavailable");
    res.setHeader("Retry-After", "5");
    return sendProblem(res, 503, "database_unavailable", "The database cannot be reached right now. Try again in a few seconds; if it lasts, tell your team admin.");
  }
  req.log?.error({ err }, "unhandled error");
  if (!req.log) console.error(err);
  sendProblem(res, 500, "internal", "Something went wrong on our side. Try again; if it keeps happening, tell your team admin.");
};
