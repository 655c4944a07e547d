import { isProblemCode, type ProblemCode } from "@shared/schemas/problem-codes";
import { env } from "./env";
import { noteServerBuild } from "./client-build";

/**
 * A failed call's code: one of the API's (the list the server's errors are typed with), or one
 * the client makes itself when there is no usable answer.
 */
export type ApiCode = ProblemCode | "network_error" | "download_failed" | "conflict" | "server_error" | "http_error";

/** One field-level problem, as named by the server's problem+json `errors` array. */
export interface FieldProblem {
  path: string;
  message: string;
}

/**
 * Every failed call becomes an ApiError: the server's problem+json (RFC 9457) when it sent one,
 * otherwise a synthetic problem with a stable `code` so callers never parse strings.
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: ApiCode;
  readonly detail: string;
  readonly errors: FieldProblem[];

  constructor(init: { status: number; code: ApiCode; detail: string; errors?: FieldProblem[] }) {
    super(init.detail);
    this.name = "ApiError";
    this.status = init.status;
    this.code = init.code;
    this.detail = init.detail;
    this.errors = init.errors ?? [];
  }
}

export const isApiError = (e: unknown): e is ApiError => e instanceof ApiError;

/** A message a person can read, whatever was thrown. */
export function errorMessage(e: unknown): string {
  if (isApiError(e)) return e.detail;
  if (e instanceof Error && e.message) return e.message;
  return "Something went wrong. Please try again.";
}

const fallbackDetail: Record<number, string> = {
  400: "The request was not understood.",
  401: "Please sign in to continue.",
  403: "You don't have access to this.",
  404: "We couldn't find that.",
  409: "That clashes with something that already exists.",
  410: "That link is no longer valid.",
  413: "That is too large to upload.",
  422: "Some of the details aren't valid.",
  429: "Too many attempts. Wait a minute and try again.",
};

const fallbackCode: Record<number, ApiCode> = {
  401: "unauthenticated",
  403: "forbidden",
  404: "not_found",
  409: "conflict",
  413: "too_large",
  429: "rate_limited",
};

function toFieldProblems(raw: unknown): FieldProblem[] {
  if (!Array.isArray(raw)) return [];
  return raw
    .filter((x): x is { path: unknown; message: unknown } => typeof x === "object" && x !== null)
    .map((x) => ({
      path: Array.isArray(x.path) ? x.path.join(".") : String(x.path ?? ""),
      message: String(x.message ?? "Invalid value"),
    }));
}

/** Turns an error response into an ApiError; accepts problem+json and better-auth's { code, message }. */
async function problemFrom(res: Response): Promise<ApiError> {
  let body: Record<string, unknown> | null = null;
  const type = res.headers.get("content-type") ?? "";
  if (type.includes("json")) {
    try {
      body = (await res.json()) as Record<string, unknown>;
    } catch {
      body = null;
    }
  }
  const str = (v: unknown) => (typeof v === "string" && v.trim() ? v : undefined);
  const detail =
    str(body?.detail) ??
    str(body?.message) ??
    str(body?.title) ??
    fallbackDetail[res.status] ??
    (res.status >= 500 ? "The server ran into a problem. Please try again in a moment." : `Request failed (${res.status}).`);
  // A code outside the API's list (an older server, a proxy) counts as the status's general one.
  const named = str(body?.code)?.toLowerCase();
  const code: ApiCode = isProblemCode(named) ? named : (fallbackCode[res.status] ?? (res.status >= 500 ? "server_error" : "http_error"));
  return new ApiError({ status: res.status, code, detail, errors: toFieldProblems(body?.errors) });
}

export type Query = Record<string, string | number | boolean | undefined | null>;

export interface RequestOptions {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  body?: unknown;
  query?: Query;
  signal?: AbortSignal;
}

function buildUrl(path: string, query?: Query): string {
  const url = `${env.apiBase}${path.startsWith("/") ? path : `/${path}`}`;
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null) params.set(k, String(v));
  const qs = params.toString();
  return qs ? `${url}?${qs}` : url;
}

/**
 * Calls the Loadframe API. `path` is relative to /api (e.g. "/me"). Sends and expects JSON,
 * keeps cookies same-origin, returns undefined for 204, throws ApiError for everything else.
 */
export async function api<T>(path: string, opts: RequestOptions = {}): Promise<T> {
  const method = opts.method ?? (opts.body === undefined ? "GET" : "POST");
  const headers: Record<string, string> = { Accept: "application/json, application/problem+json" };
  let body: BodyInit | undefined;
  if (opts.body !== undefined) {
    headers["Content-Type"] = "application/json";
    body = JSON.stringify(opts.body);
  } else if (method !== "GET") {
    // better-auth and express.json() both want a JSON body on writes, even an empty one.
    headers["Content-Type"] = "application/json";
    body = "{}";
  }

  let res: Response;
  try {
    res = await fetch(buildUrl(path, opts.query), { method, headers, body, credentials: "same-origin", signal: opts.signal });
  } catch (e) {
    if (e instanceof DOMException && e.name === "AbortError") throw e;
    throw new ApiError({
      status: 0,
      code: "network_error",
      detail: "Can't reach the Loadframe server. Check your connection and try again.",
    });
  }

  if (!res.ok) throw await problemFrom(res);
  noteServerBuild(res);
  if (res.status === 204 || res.headers.get("content-length") === "0") return undefined as T;
  const type = res.headers.get("content-type") ?? "";
  if (!type.includes("json")) return undefined as T;
  return (await res.json()) as T;
}

export const apiGet = <T>(path: string, query?: Query, signal?: AbortSignal) => api<T>(path, { method: "GET", query, signal });
export const apiPost = <T>(path: string, body?: unknown) => api<T>(path, { method: "POST", body });
export const apiPut = <T>(path: string, body?: unknown) => api<T>(path, { method: "PUT", body });
export const apiPatch = <T>(path: string, body?: unknown) => api<T>(path, { method: "PATCH", body });
export const apiDelete = <T = void>(path: string) => api<T>(path, { method: "DELETE" });
