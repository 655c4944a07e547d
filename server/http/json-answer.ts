import { hash } from "node:crypto";
import type { Express, Response } from "express";

/**
 * A weak validator for a JSON answer: its length and a SHA-1 of its text, like Express's own
 * (`etag` package), hashed straight from the string without a Buffer copy.
 */
export const weakTag = (text: string) => weakTagOf(text.length, text);

/**
 * The same for an answer assembled from pieces whose hashes the caller already holds (one shot's
 * stored results, hashed once for their shape check, decision 175): a hash of the pieces instead
 * of the whole text again. Any change of any piece, or of the length, changes the tag.
 */
export function weakTagOf(length: number, ...pieces: string[]): string {
  return `W/"${length.toString(16)}-${hash("sha1", pieces.length === 1 ? pieces[0] : pieces.join("\u0000"), "base64url")}"`;
}

/**
 * Answers with JSON text: Content-Type, Content-Length, a weak ETag on a successful GET or HEAD
 * (304 when the client's copy is current, RFC 9110 §13.1.2), and the header and body in one
 * socket write. Express's `res.send` turns every text over 1,000 characters into a Buffer (to hash
 * it for its ETag), and Node then writes the header and that Buffer as two chunks (decision 177).
 * `tag` is a validator the caller already has for exactly this text; `text` may be its UTF-8 bytes
 * (a kept answer, decision 192), which then need the tag.
 */
export function sendJsonText(res: Response, text: string | Buffer, tag?: string): Response {
  const req = res.req;
  if (!res.hasHeader("Content-Type")) res.setHeader("Content-Type", "application/json; charset=utf-8");
  const s = res.statusCode;
  if (s >= 200 && s < 300 && (req.method === "GET" || req.method === "HEAD")) {
    res.setHeader("ETag", tag ?? weakTag(String(text)));
    if (req.fresh) res.statusCode = 304;
  }
  if (res.statusCode === 204 || res.statusCode === 304) {
    res.removeHeader("Content-Type");
    res.removeHeader("Content-Length");
    res.removeHeader("Transfer-Encoding");
    res.end();
    return res;
  }
  res.setHeader("Content-Length", typeof text === "string" ? Buffer.byteLength(text) : text.length);
  if (req.method === "HEAD") res.end();
  else res.end(text);
  return res;
}

/** Every `res.json(value)` of the app answers through `sendJsonText`. */
export function leanJsonAnswers(app: Express) {
  app.response.json = function json(this: Response, value: unknown) {
    // JSON.stringify(undefined) is undefined: an empty body, as Express sends.
    return sendJsonText(this, JSON.stringify(value) ?? "");
  };
}
