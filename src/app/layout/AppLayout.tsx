import { useEffect, useId, useRef, useState } from "react";
import { Navigate, NavLink, Outlet, useLocation, useMatches, useNavigation } from "react-router-dom";
import { cn } from "@/lib/cn";
import { useActiveTeam, useMe } from "@/lib/session";
import { signInUrl } from "../guards";
import { visibleNav } from "../nav";
import { Brand } from "./Brand";
import { TeamSwitcher } from "./TeamSwitcher";
import { UserMenu } from "./UserMenu";
import { BillingBanner } from "@/features/billing/components/BillingBanner";
import { UpdateBanner } from "./UpdateBanner";

/** Routes may carry `handle: { title }`; the deepest one names the browser tab. */
export function useDocumentTitle() {
  const matches = useMatches();
  const title = [...matches].reverse().find((m) => (m.handle as { title?: string } | undefined)?.title)?.handle as { title?: string } | undefined;
  useEffect(() => {
    document.title = title?.title ? `${title.title} · Loadframe` : "Loadframe";
  }, [title?.title]);
}

export function AppLayout() {
  const { data: me } = useMe();
  const team = useActiveTeam();
  const navigation = useNavigation();
  const location = useLocation();
  useDocumentTitle();

  const items = [{ to: "/", label: "Home" }, ...visibleNav(team?.role)];

  // The loader checked the session on the way in; this catches it ending while the page is open.
  if (!me) return <Navigate to={signInUrl(location.pathname + location.search)} replace />;

  return (
    <div className="flex min-h-dvh flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:z-50 focus:rounded-lg focus:bg-surface focus:px-3 focus:py-2 focus:shadow">
        Skip to content
      </a>
      <header className="sticky top-0 z-30 border-b border-line bg-surface/95 backdrop-blur">
        <div className="mx-auto flex h-16 max-w-7xl items-center gap-3 px-4 sm:gap-4 sm:px-6">
          <Brand />
          <span aria-hidden className="hidden h-6 w-px bg-line sm:block" />
          <TeamSwitcher />
          <div className="flex-1" />
          <PhoneMenu items={items} />
          <UserMenu />
        </div>
        {/* Tabs from tablet width up; phones get the menu button above instead. */}
        <nav aria-label="Areas" className="mx-auto hidden max-w-7xl gap-1 px-4 sm:px-6 md:flex">
          {items.map((item) => (
            <NavTab key={item.to} to={item.to} end={item.to === "/"}>
              {item.label}
            </NavTab>
          ))}
        </nav>
        <div aria-hidden className={cn("h-0.5 origin-left bg-accent transition-transform duration-500", navigation.state === "idle" ? "scale-x-0" : "scale-x-75")} />
      </header>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-8 sm:px-6">
        <UpdateBanner />
        <BillingBanner />
        <Outlet />
      </main>
    </div>
  );
}

function NavTab({ to, end, children }: { to: string; end?: boolean; children: React.ReactNode }) {
  return (
    <NavLink
      to={to}
      end={end}
      className={({ isActive }) =>
        cn(
          "-mb-px border-b-2 px-3 py-2.5 text-sm font-medium whitespace-nowrap transition-colors",
          isActive ? "border-accent text-ink" : "border-transparent text-ink-muted hover:border-line-strong hover:text-ink",
        )
      }
    >
      {children}
    </NavLink>
  );
}

/**
 * Below tablet width the areas sit behind one button (a disclosure, not a menu: its entries are
 * plain links). It closes on a choice, on Escape (focus back on the button) and on a tap outside.
 */
function PhoneMenu({ items }: { items: { to: string; label: string }[] }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  const root = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);
  const { pathname } = useLocation();
  useEffect(() => setOpen(false), [pathname]);
  useEffect(() => {
    if (!open) return;
    const away = (e: PointerEvent) => !root.current?.contains(e.target as Node) && setOpen(false);
    const esc = (e: KeyboardEvent) => {
      if (e.key !== "Escape") return;
      setOpen(false);
      button.current?.focus();
    };
    document.addEventListener("pointerdown", away);
    document.addEventListener("keydown", esc);
    return () => {
      document.removeEventListener("pointerdown", away);
      document.removeEventListener("keydown", esc);
    };
  }, [open]);
  const current = [...items].reverse().find((i) => (i.to === "/" ? pathname === "/" : pathname.startsWith(i.to)));
  return (
    <div ref={root} className="md:hidden">
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
        className="flex h-10 items-center gap-2 rounded-lg border border-line px-3 text-sm font-medium text-ink hover:bg-sunken"
      >
        <svg aria-hidden viewBox="0 0 16 16" className="size-4">
          <path d={open ? "M4 4l8 8M12 4l-8 8" : "M2.5 4h11M2.5 8h11M2.5 12h11"} stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        Menu
        <span className="sr-only">{current ? `, now on ${current.label}` : ""}</span>
      </button>
      {open && (
        <nav id={id} aria-label="Areas" className="absolute inset-x-0 top-16 border-b border-line bg-surface px-4 pt-2 pb-4 shadow-[var(--shadow-pop)]">
          <ul className="grid grid-cols-2 gap-1">
            {items.map((item) => (
              <li key={item.to}>
                <NavLink
                  to={item.to}
                  end={item.to === "/"}
                  className={({ isActive }) =>
                    cn("flex min-h-11 items-center rounded-lg px-3 text-[0.95rem] font-medium", isActive ? "bg-accent-soft text-accent-strong" : "text-ink hover:bg-sunken")
                  }
                >
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
      )}
    </div>
  );
}
