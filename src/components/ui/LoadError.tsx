import { errorMessage } from "@/lib/api";
import { Alert } from "./Alert";
import { Button } from "./Button";

/** A failed page load: what could not be loaded, the server's reason, and a retry. */
export function LoadError({ title, error, onRetry }: { title: string; error: unknown; onRetry: () => void }) {
  return (
    <Alert tone="danger" title={title}>
      <p>{errorMessage(error)}</p>
      <Button variant="secondary" size="sm" className="mt-3" onClick={onRetry}>
        Try again
      </Button>
    </Alert>
  );
}
