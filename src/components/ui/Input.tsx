import type { InputHTMLAttributes, SelectHTMLAttributes, TextareaHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

const control =
  "block w-full rounded-lg border border-line-strong bg-surface text-ink placeholder:text-ink-faint " +
  "shadow-[inset_0_1px_1px_rgb(27_34_36/0.04)] transition-colors " +
  "focus-visible:border-accent focus-visible:outline-2 focus-visible:outline-offset-0 focus-visible:outline-accent/40 " +
  "aria-invalid:border-danger aria-invalid:focus-visible:outline-danger/40 " +
  "disabled:cursor-not-allowed disabled:bg-sunken disabled:text-ink-muted";

export function Input({ className, ...rest }: InputHTMLAttributes<HTMLInputElement>) {
  return <input className={cn(control, "h-10 px-3", className)} {...rest} />;
}

export function Textarea({ className, ...rest }: TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <textarea className={cn(control, "min-h-24 px-3 py-2", className)} {...rest} />;
}

export interface SelectProps extends SelectHTMLAttributes<HTMLSelectElement> {
  compact?: boolean;
}

/** A native select (keyboard and screen readers work as people expect) with our look. */
export function Select({ className, compact = false, children, ...rest }: SelectProps) {
  return (
    <div className={cn("relative", className)}>
      <select className={cn(control, "appearance-none pr-9 pl-3", compact ? "h-8 text-sm" : "h-10")} {...rest}>
        {children}
      </select>
      <svg aria-hidden viewBox="0 0 16 16" className="pointer-events-none absolute top-1/2 right-3 size-4 -translate-y-1/2 text-ink-muted">
        <path d="M4 6l4 4 4-4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
    </div>
  );
}
