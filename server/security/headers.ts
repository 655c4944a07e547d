import type { IncomingMessage, ServerResponse } from "node:http";
import helmet, { type HelmetOptions } from "helmet";

/**
 * The protective headers of every answer, as helmet's options. Browsers must be told to use https
 * only when people reach the app over https: on a club's plain-http network
 * (PUBLIC_URL=http://192.168.1.20:3000) HSTS and upgrade-insecure-requests would turn every asset
 * request into an https one that fails, leaving a blank page.
 */
export function helmetOptions(https: boolean): HelmetOptions {
  return {
    strictTransportSecurity: https,
    contentSecurityPolicy: {
      directives: {
        defaultSrc: ["'self'"],
        imgSrc: ["'self'", "data:", "blob:"],
        workerSrc: ["'self'", "blob:"],
        // opencv.js (tracking assist) compiles WebAssembly in a worker
        scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        connectSrc: ["'self'"],
        fontSrc: ["'self'", "data:"],
        objectSrc: ["'none'"],
        frameAncestors: ["'none'"],
        upgradeInsecureRequests: https ? [] : null,
      },
    },
    crossOriginEmbedderPolicy: false,
  };
}

/**
 * The headers helmet sets with these options, found once by running its middleware on a
 * recording answer. None of our options depends on the request (no directive is a function), so
 * the set is the same for every answer.
 */
export function helmetHeaders(options: HelmetOptions): [string, string][] {
  const headers = new Map<string, [string, string]>();
  const recorder = {
    setHeader(name: string, value: string) {
      headers.set(name.toLowerCase(), [name, String(value)]);
      return recorder;
    },
    removeHeader(name: string) {
      headers.delete(name.toLowerCase());
    },
    getHeader: (name: string) => headers.get(name.toLowerCase())?.[1],
    locals: {},
  };
  let failed: unknown;
  helmet(options)({ headers: {}, method: "GET", url: "/" } as IncomingMessage, recorder as unknown as ServerResponse, (err?: unknown) => (failed = err));
  if (failed) throw failed;
  return [...headers.values()];
}

/**
 * Sets helmet's headers from the list computed at start-up: the same headers, without running
 * helmet's dozen middlewares and rebuilding the content security policy on every request
 * (decision 177). Any helmet option that depended on the request would make the recorded set
 * wrong; `helmetHeaders` is held to helmet itself by a test.
 */
export function securityHeaders(options: HelmetOptions): (res: ServerResponse) => void {
  const headers = helmetHeaders(options);
  return (res) => {
    for (const [name, value] of headers) res.setHeader(name, value);
  };
}
