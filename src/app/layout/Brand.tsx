import { Link } from "react-router-dom";
import { cn } from "@/lib/cn";

/** Loadframe's mark: a shaft bending under a centre load between two supports (a three-point bend). */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" fill="none" aria-hidden className={cn("size-8 shrink-0", className)}>
      <rect width="32" height="32" rx="7" className="fill-accent" />
      <path d="M4.5 15.5 Q16 23 27.5 15.5" stroke="#fff" strokeWidth="2.8" strokeLinecap="round" />
      <path d="M16 4v8.5" className="stroke-gold" strokeWidth="2.6" strokeLinecap="round" />
      <path d="M12.6 9.6 16 13l3.4-3.4" className="stroke-gold" strokeWidth="2.4" strokeLinecap="round" strokeLinejoin="round" />
      <path d="M3.5 25.5h6L6.5 18.5zM22.5 25.5h6l-3-7z" fill="#fff" opacity=".9" />
    </svg>
  );
}

export function Brand({ to = "/" }: { to?: string }) {
  return (
    <Link to={to} aria-label="Loadframe home" className="flex shrink-0 items-center gap-2.5 rounded-lg pr-1 text-ink">
      <BrandMark />
      <span className="hidden text-lg font-semibold tracking-tight sm:inline">Loadframe</span>
    </Link>
  );
}
