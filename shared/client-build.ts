/**
 * The answer header that names the page build the server serves (the built index.html's entry
 * script): set on /api/me by server/http/client-build.ts, compared by src/lib/client-build.ts
 * (decision 203).
 */
export const CLIENT_BUILD_HEADER = "X-Client-Build";
