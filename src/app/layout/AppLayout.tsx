import { useEffect } from "react";
import { Navigate, NavLink, Outlet, useLocation, useMatches, useNavigation } from "react-router-dom";
import { cn } from "@/lib/cn";
import { useActiveTeam, useMe } from "@/lib/session";
import { signInUrl } from "../guards";
import { visibleNav } from "../nav";
import { Brand } from "./Brand";
import { TeamSwitcher } from "./TeamSwitcher";
import { UserMenu } from "./UserMenu";

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
          <UserMenu />
        </div>
        <nav aria-label="Areas" className="mx-auto flex max-w-7xl gap-1 overflow-x-auto px-4 sm:px-6">
          <NavTab to="/" end>
            Home
          </NavTab>
          {visibleNav(team?.role).map((item) => (
            <NavTab key={item.to} to={item.to}>
              {item.label}
            </NavTab>
          ))}
        </nav>
        <div aria-hidden className={cn("h-0.5 origin-left bg-accent transition-transform duration-500", navigation.state === "idle" ? "scale-x-0" : "scale-x-75")} />
      </header>
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-8 sm:px-6">
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
