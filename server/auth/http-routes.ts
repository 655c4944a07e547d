// better-auth answers dozens of HTTP routes of its own under /api/auth: e-mail sign-up, user
// updates, and the organization plugin's team routes (list members with their e-mails, change
// roles, remove, invite, rename the team). The product uses five of them. Every other path
// answers 404 here, before the library sees it, so accounts come only from the product's own
// flows (server/auth/accounts.ts) and every membership change goes through our roster service,
// policy and audit log. The five get a small body limit and the same zod checks as the rest of
// the API; what passes is handed on re-serialised, unknown fields dropped.
import express, { type RequestHandler } from "express";
import { z } from "zod";
import { sendProblem, zodToHttp } from "../http/problem";
import { EmailSchema, PasswordSchema } from "../../shared/schemas/roster";
import { unsafeTextProblem } from "../../shared/schemas/text";

/** A sign-in or reset body is a few hundred bytes; 16 kB leaves room and refuses the rest unread. */
export const AUTH_BODY_LIMIT_BYTES = 16 * 1024;

/** The header better-auth reads the client's address from (server/auth/auth.ts); set here only. */
export const CLIENT_ADDRESS_HEADER = "x-loadframe-client-address";

const link = z
  .string()
  .max(2000, "The address is too long")
  .refine((v) => !unsafeTextProblem(v), "The address contains a control character");

interface ExposedRoute {
  method: "GET" | "POST";
  path: RegExp;
  body?: z.ZodType;
}

export const EXPOSED_AUTH_ROUTES: readonly ExposedRoute[] = [
  {
    method: "POST",
    path: /^\/sign-in\/email$/,
    body: z.object({
      email: EmailSchema,
      password: z.string({ error: "Enter your password" }).min(1, "Enter your password").max(128, "A password has at most 128 characters"),
      rememberMe: z.boolean().optional(),
      callbackURL: link.optional(),
    }),
  },
  { method: "POST", path: /^\/sign-out$/, body: z.object({}) },
  { method: "POST", path: /^\/request-password-reset$/, body: z.object({ email: EmailSchema, redirectTo: link.optional() }) },
  {
    method: "POST",
    path: /^\/reset-password$/,
    body: z.object({ newPassword: PasswordSchema, token: z.string({ error: "The reset link is incomplete" }).min(1).max(200).regex(/^[\w-]+$/, "The reset link is not valid") }),
  },
  // The link in the reset mail: better-auth checks the token and redirects to the reset page.
  { method: "GET", path: /^\/reset-password\/[\w-]{1,200}$/ },
];

const json = express.json({ limit: AUTH_BODY_LIMIT_BYTES, type: "application/json" });
const hasBody = (h: Record<string, string | string[] | undefined>) => h["transfer-encoding"] !== undefined || Number(h["content-length"] ?? 0) > 0;

/** Mount at /api/auth before better-auth's handler. */
export const authRouteGuard: RequestHandler = (req, res, next) => {
  const route = EXPOSED_AUTH_ROUTES.find((r) => r.method === req.method && r.path.test(req.path));
  if (!route) return sendProblem(res, 404, "not_found", "No such API route.");
  // better-auth records this address on the session row; it comes from our trust-proxy setting,
  // never from a header the client chose.
  req.headers[CLIENT_ADDRESS_HEADER] = req.ip ?? "";
  if (!route.body) return next();
  if (hasBody(req.headers) && !req.is("application/json"))
    return sendProblem(res, 415, "unsupported_media_type", "Send the request body as JSON (Content-Type: application/json).");
  json(req, res, (err?: unknown) => {
    if (err) return next(err);
    const r = route.body!.safeParse(req.body ?? {});
    if (!r.success) {
      const h = zodToHttp(r.error);
      return sendProblem(res, h.status, h.code, h.message, h.errors);
    }
    // Only a body that was read may be replaced: better-auth re-serialises req.body then.
    if (req.readableEnded) req.body = r.data;
    next();
  });
};
