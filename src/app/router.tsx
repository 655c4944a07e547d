import { createBrowserRouter, Outlet } from "react-router-dom";
import { PageSpinner } from "@/components/ui";
import { meKey } from "@/lib/session";
import { redirectIfSignedIn, requireSession, signInUrl } from "./guards";
import { AppLayout, useDocumentTitle } from "./layout/AppLayout";
import { queryClient, setUnauthenticatedHandler } from "./query-client";
import { RootError, RouteError } from "./RouteError";
import { publicRoutes, signedInRoutes } from "./routes";

function PublicShell() {
  useDocumentTitle();
  return <Outlet />;
}

export const router = createBrowserRouter([
  {
    id: "root",
    errorElement: <RootError />,
    hydrateFallbackElement: <PageSpinner />,
    children: [
      {
        element: <PublicShell />,
        children: [
          { path: "sign-in", handle: { title: "Sign in" }, loader: redirectIfSignedIn, lazy: () => import("@/features/auth/routes/SignInPage") },
          ...publicRoutes,
        ],
      },
      {
        id: "signed-in",
        path: "/",
        loader: requireSession,
        element: <AppLayout />,
        // Errors inside a page render here, below the top bar, so people can move on.
        children: [{ errorElement: <RouteError />, children: signedInRoutes }],
      },
    ],
  },
]);

// A 401 from any query or mutation means the session ended: forget it and ask to sign in again.
setUnauthenticatedHandler(() => {
  const { pathname, search } = router.state.location;
  if (pathname === "/sign-in") return;
  queryClient.setQueryData(meKey, null);
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== meKey[0] });
  void router.navigate(signInUrl(pathname + search), { replace: true });
});
