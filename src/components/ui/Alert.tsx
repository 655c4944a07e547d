import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

type AlertTone = "danger" | "ok" | "info" | "warn";

const tones: Record<AlertTone, string> = {
  danger: "border-danger/30 bg-danger-soft text-danger-strong",
  ok: "border-ok/30 bg-ok-soft text-ok",
  info: "border-accent/25 bg-accent-soft text-accent-strong",
  warn: "border-warn/30 bg-warn-soft text-warn",
};

/** A message inside the page (a form's overall error, a notice); toasts are for everything else. */
export function Alert({ tone = "info", title, children, className }: { tone?: AlertTone; title?: ReactNode; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === "danger" ? "alert" : "status"} className={cn("rounded-lg border px-4 py-3 text-sm", tones[tone], className)}>
      {title && <p className="font-semibold">{title}</p>}
      {children && <div className={title ? "mt-0.5" : undefined}>{children}</div>}
    </div>
  );
}
