import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { toast } from "@/components/ui/toast-store";
import { errorMessage, isApiError } from "@/lib/api";

/**
 * Extra switches a query or mutation can carry in `meta`:
 * - `toast: false` — the page or form shows the error itself, so no toast.
 * - `errorTitle` — the toast's title, naming what failed ("Couldn't delete the shot").
 * - `authRedirect: false` — a 401 here is an answer (e.g. a wrong password), not an expired session.
 * A failure is reported once: here, or by the page when it says `toast: false` — never both, so
 * no caller raises an error toast of its own.
 */
export interface AppMeta extends Record<string, unknown> {
  toast?: false;
  errorTitle?: string;
  authRedirect?: false;
}

declare module "@tanstack/react-query" {
  interface Register {
    queryMeta: AppMeta;
    mutationMeta: AppMeta;
  }
}

let onUnauthenticated: () => void = () => {};

/** The router registers how to send people to sign-in when the session has ended. */
export function setUnauthenticatedHandler(fn: () => void) {
  onUnauthenticated = fn;
}

const endedSession = (e: unknown, meta: AppMeta | undefined) => isApiError(e) && e.status === 401 && meta?.authRedirect !== false;

export const queryClient = new QueryClient({
  queryCache: new QueryCache({
    onError: (error, query) => {
      if (endedSession(error, query.meta)) return onUnauthenticated();
      // A first load shows its error in the page; a failed background refresh would go unseen.
      if (query.state.data !== undefined && query.meta?.toast !== false) toast.error(errorMessage(error));
    },
  }),
  mutationCache: new MutationCache({
    onError: (error, _vars, _ctx, mutation) => {
      if (endedSession(error, mutation.meta)) return onUnauthenticated();
      if (mutation.meta?.toast !== false) toast.error(errorMessage(error), mutation.meta?.errorTitle);
    },
  }),
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      gcTime: 5 * 60_000,
      // Client errors (4xx) will not change on retry; network and server errors may.
      retry: (count, e) => (isApiError(e) && e.status >= 400 && e.status < 500 ? false : count < 2),
      refetchOnWindowFocus: true,
    },
    mutations: { retry: false },
  },
});
