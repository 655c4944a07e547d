import { useSyncExternalStore } from "react";
import { Alert, Button } from "@/components/ui";
import { isOutOfDate, subscribeOutOfDate } from "@/lib/client-build";

/** Under the top bar once the server runs a newer Loadframe than this tab: one click reloads it. */
export function UpdateBanner() {
  const outOfDate = useSyncExternalStore(subscribeOutOfDate, isOutOfDate);
  if (!outOfDate) return null;
  return (
    <Alert tone="info" title="Loadframe has been updated" className="mb-6">
      <div className="flex flex-wrap items-center gap-3">
        <span>This tab still runs the earlier version, so some pages may not show everything. Reloading keeps you where you are; save any open edits first.</span>
        <Button size="sm" onClick={() => window.location.reload()}>
          Reload
        </Button>
      </div>
    </Alert>
  );
}
