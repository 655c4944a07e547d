import { Link } from "react-router-dom";
import { cn } from "@/lib/cn";

/** Loadframe's mark: a shaft bending under a load between two supports. */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" fill="none" aria-hidden className={cn("size-8 shrink-0", className)}>
      <rect width="32" height="32" rx="7" className="fill-accent" />
      <path d="M5 13.5 Q16 21 27 13.5" stroke="#fff" strokeWidth="2.6" strokeLinecap="round" />
      <path d="M16 5.5v7.5" className="stroke-gold" strokeWidth="2.6" strokeLinecap="round" />
      <path d="M12.8 10.4 16 13.6l3.2-3.2" className="stroke-gold" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round" />
      <path d="M4 25h6l-3-5zM22 25h6l-3-5z" fill="#fff" />
    </svg>
  );
}

export function Brand({ to = "/" }: { to?: string }) {
  return (
    <Link to={to} className="flex items-center gap-2.5 rounded-lg pr-1 text-ink">
      <BrandMark />
      <span className="text-lg font-semibold tracking-tight">Loadframe</span>
    </Link>
  );
}
