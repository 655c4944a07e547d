import type { UseQueryResult } from "@tanstack/react-query";
import { Link } from "react-router-dom";
import { Alert, Button, EmptyState, PageSpinner } from "@/components/ui";
import { errorMessage, isApiError } from "@/lib/api";

/** Spinner, "not found" or error for a stick page's first load; null once the data is there. */
export function StickLoadState({ query }: { query: UseQueryResult<unknown> }) {
  if (query.isPending) return <PageSpinner label="Loading the stick…" />;
  if (query.isError && isApiError(query.error) && query.error.status === 404)
    return (
      <EmptyState title="That stick isn't here" action={<Link className="text-accent underline" to="/sticks">Back to the Stick lab</Link>}>
        It may have been removed, or it belongs to someone else.
      </EmptyState>
    );
  if (query.isError)
    return (
      <Alert tone="danger" title="Couldn't load the stick">
        <p>{errorMessage(query.error)}</p>
        <Button variant="secondary" size="sm" className="mt-3" onClick={() => query.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  return null;
}

export function BackToStick({ to, label }: { to: string; label: string }) {
  return (
    <Link to={to} className="hover:underline">
      ← {label}
    </Link>
  );
}
