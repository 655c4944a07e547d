import { LRUCache } from "lru-cache";

/**
 * How long one process may reuse the answer to "who sent this Cookie header" for reads
 * (docs/decisions/174). better-auth's cookie copy of the session is trusted for the rest of
 * SESSION_CACHE_S, so a revoked session is still honoured for at most SESSION_CACHE_S in all.
 */
export const SESSION_MEMO_S = 5;

/**
 * Signed-in people by the exact Cookie header that proved it, for safe methods only. Only
 * sessions that verified are kept (a forged or random cookie never gets an entry), the count is
 * bounded, and any change of the header (signing out clears the cookies) misses.
 */
export function sessionMemo<T extends object>(max = 2000) {
  const cache = new LRUCache<string, T>({ max, ttl: SESSION_MEMO_S * 1000, ttlAutopurge: false });
  return {
    get: (cookie: string | undefined) => (cookie ? cache.get(cookie) : undefined),
    set: (cookie: string | undefined, value: T) => void (cookie && cache.set(cookie, value)),
    clear: () => cache.clear(),
  };
}
