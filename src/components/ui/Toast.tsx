import { useSyncExternalStore } from "react";
import { cn } from "@/lib/cn";
import { dismissToast, getToasts, subscribeToasts, type ToastTone } from "./toast-store";

export { toast } from "./toast-store";

const toneClasses: Record<ToastTone, string> = {
  error: "border-danger/30 bg-surface before:bg-danger",
  success: "border-ok/30 bg-surface before:bg-ok",
  info: "border-accent/30 bg-surface before:bg-accent",
};

const toneTitle: Record<ToastTone, string> = { error: "Couldn't do that", success: "Done", info: "Note" };

/** Renders the toast queue; mount once near the root. */
export function Toaster() {
  const toasts = useSyncExternalStore(subscribeToasts, getToasts, getToasts);
  return (
    <div aria-live="polite" className="pointer-events-none fixed right-4 bottom-4 z-50 flex w-[min(24rem,calc(100vw-2rem))] flex-col gap-2">
      {toasts.map((t) => (
        <div
          key={t.id}
          role={t.tone === "error" ? "alert" : "status"}
          className={cn(
            "pointer-events-auto relative flex items-start gap-3 overflow-hidden rounded-lg border py-3 pr-2 pl-4 shadow-[var(--shadow-pop)]",
            "before:absolute before:inset-y-0 before:left-0 before:w-1",
            toneClasses[t.tone],
          )}
        >
          <div className="min-w-0 flex-1">
            <p className="text-sm font-semibold text-ink">{t.title ?? toneTitle[t.tone]}</p>
            <p className="mt-0.5 text-sm text-ink-muted">{t.message}</p>
          </div>
          <button
            type="button"
            onClick={() => dismissToast(t.id)}
            className="rounded-md p-1 text-ink-faint hover:bg-sunken hover:text-ink"
            aria-label="Dismiss message"
          >
            <svg aria-hidden viewBox="0 0 16 16" className="size-4">
              <path d="M4 4l8 8M12 4l-8 8" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
            </svg>
          </button>
        </div>
      ))}
    </div>
  );
}
