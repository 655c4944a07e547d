// Errors that mean "PostgreSQL cannot be reached right now" rather than "this request is wrong":
// the API answers them 503 with Retry-After, so clients and load balancers wait and retry.
// SQLSTATE class 08 (connection exception) and 57P01–57P03 (shutting down, starting up) are from
// the PostgreSQL manual, appendix A "PostgreSQL Error Codes"; the rest are node-postgres messages
// ("Query read timeout" also from the pool's own deadline, server/db/query-deadline.ts).
const NODE_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH"]);
const PG_MESSAGES = /Connection terminated|timeout exceeded when trying to connect|Query read timeout|Client has encountered a connection error/i;

export function isDatabaseDown(err: unknown): boolean {
  for (let e = err as { code?: unknown; message?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    const code = typeof e.code === "string" ? e.code : "";
    if (NODE_CODES.has(code) || code.startsWith("08") || ["57P01", "57P02", "57P03"].includes(code)) return true;
    if (typeof e.message === "string" && PG_MESSAGES.test(e.message)) return true;
  }
  return false;
}
