import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import { BrandMark } from "@/app/layout/Brand";

interface AuthShellProps {
  title: ReactNode;
  description?: ReactNode;
  children: ReactNode;
  /** Small print under the card (links back, help). */
  footer?: ReactNode;
}

const points = [
  "Puck exit speed, blade speed and timing from high-speed clips — each with its ± uncertainty",
  "Stick bend, stored energy and measured flex from three-point bench tests",
  "Shared inside your team only, with roles for admins, coaches, analysts and players",
];

/** The frame of every signed-out page: a quiet brand panel beside one focused card. */
export function AuthShell({ title, description, children, footer }: AuthShellProps) {
  return (
    <div className="grid min-h-dvh lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)]">
      <aside className="hidden bg-accent-strong px-12 py-12 text-white lg:flex lg:flex-col">
        <Link to="/" className="flex items-center gap-3">
          <BrandMark className="size-9 ring-1 ring-white/25 rounded-[7px]" />
          <span className="text-xl font-semibold tracking-tight">Loadframe</span>
        </Link>
        <div aria-hidden className="flex flex-1 items-center py-10">
          <BendSketch />
        </div>
        <div className="max-w-md">
          <p className="text-3xl leading-tight font-semibold tracking-tight">Shot video and stick tests, turned into numbers your team can trust.</p>
          <ul className="mt-8 space-y-4">
            {points.map((p) => (
              <li key={p} className="flex gap-3 text-[0.95rem] text-white/85">
                <span aria-hidden className="mt-2 size-1.5 shrink-0 rounded-full bg-gold" />
                {p}
              </li>
            ))}
          </ul>
        </div>
      </aside>

      <main className="flex flex-col items-center justify-center px-4 py-12 sm:px-8">
        <div className="mb-8 flex items-center gap-2.5 lg:hidden">
          <BrandMark />
          <span className="text-lg font-semibold tracking-tight">Loadframe</span>
        </div>
        <div className="w-full max-w-md">
          <div className="rounded-[var(--radius-card)] border border-line bg-surface p-8 shadow-[var(--shadow-card)]">
            <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
            {description && <div className="mt-1.5 text-[0.95rem] text-ink-muted">{description}</div>}
            <div className="mt-6">{children}</div>
          </div>
          {footer && <div className="mt-6 text-center text-sm text-ink-muted">{footer}</div>}
        </div>
      </main>
    </div>
  );
}

/** A faint deflection sketch in the panel's corner: a shaft bent between two supports. */
function BendSketch() {
  return (
    <svg viewBox="0 0 400 160" className="w-full max-w-md opacity-[0.18]" fill="none" stroke="#fff">
      <path d="M20 60 Q200 130 380 60" strokeWidth="6" strokeLinecap="round" />
      <path d="M20 60 L380 60" strokeWidth="1.5" strokeDasharray="6 8" />
      <path d="M200 8v70" strokeWidth="4" strokeLinecap="round" />
      <path d="M186 64l14 16 14-16" strokeWidth="4" strokeLinecap="round" strokeLinejoin="round" />
      <path d="M4 96h32l-16-26zM364 96h32l-16-26z" fill="#fff" stroke="none" />
    </svg>
  );
}
