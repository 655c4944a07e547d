import { cn } from "@/lib/cn";

interface SpinnerProps {
  size?: "sm" | "md" | "lg";
  /** Read out to screen readers; visible only when `showLabel`. */
  label?: string;
  showLabel?: boolean;
  className?: string;
}

const sizes = { sm: "size-4 border-2", md: "size-6 border-[3px]", lg: "size-10 border-4" };

export function Spinner({ size = "md", label = "Loading…", showLabel = false, className }: SpinnerProps) {
  return (
    <span role="status" className={cn("inline-flex items-center gap-2 text-ink-muted", className)}>
      <span aria-hidden className={cn("animate-spin rounded-full border-current border-r-transparent", sizes[size])} />
      <span className={showLabel ? "text-sm" : "sr-only"}>{label}</span>
    </span>
  );
}

/** Fills the content area while a page's first data arrives. */
export function PageSpinner({ label = "Loading…" }: { label?: string }) {
  return (
    <div className="flex min-h-[40vh] items-center justify-center">
      <Spinner size="lg" label={label} showLabel />
    </div>
  );
}
