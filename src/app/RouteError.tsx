import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { Button, buttonClasses } from "@/components/ui";
import { isApiError } from "@/lib/api";
import { BrandMark } from "./layout/Brand";

function describe(error: unknown): { title: string; message: string } {
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) return { title: "Page not found", message: "That address doesn't lead anywhere in Loadframe. Check the link, or go back to the start." };
    return { title: "Something went wrong", message: error.statusText || "The page could not be shown." };
  }
  if (isApiError(error)) {
    if (error.status === 0) return { title: "Can't reach Loadframe", message: error.detail };
    if (error.status === 403) return { title: "Not available to you", message: "Your role in this team doesn't include this page. A team admin can change your role." };
    if (error.status === 404) return { title: "Not found", message: "We couldn't find that in this team. It may have been removed, or it belongs to another team." };
    return { title: "Something went wrong", message: error.detail };
  }
  return { title: "Something went wrong", message: "This page hit an unexpected problem. Reloading usually helps; if it keeps happening, tell your team admin." };
}

/** Shown inside the signed-in layout when a page fails: the top bar stays, so people can move on. */
export function RouteError() {
  const error = useRouteError();
  const { title, message } = describe(error);
  if (import.meta.env.DEV) console.error(error);
  return (
    <div role="alert" className="mx-auto max-w-lg py-16 text-center">
      <h1 className="text-xl font-semibold">{title}</h1>
      <p className="mt-2 text-ink-muted">{message}</p>
      <div className="mt-6 flex justify-center gap-2">
        <Button variant="secondary" onClick={() => window.location.reload()}>
          Try again
        </Button>
        <Link to="/" className={buttonClasses("primary")}>
          Go to home
        </Link>
      </div>
    </div>
  );
}

/** The last resort, when even the layout could not render (e.g. the server is down at start). */
export function RootError() {
  return (
    <div className="flex min-h-dvh flex-col items-center justify-center px-4">
      <BrandMark className="mb-6 size-10" />
      <RouteError />
    </div>
  );
}
