import { Suspense, useState } from "react";
import { NavLink, Outlet, useLocation } from "react-router-dom";
import type { Role } from "../features/auth/api/get-me.ts";
import { useAuth } from "../features/auth/components/auth-context.tsx";
import { UserMenu } from "../features/auth/components/user-menu.tsx";
import { useHealth } from "../features/platform/api/get-health.ts";
import { apiPaths, paths } from "../lib/paths.ts";
import { DocumentTitle } from "../components/ui/document-title.tsx";
import { ErrorBoundary } from "../components/ui/error-boundary.tsx";
import { LiveRegion } from "../components/ui/live-region.tsx";

interface NavItem {
  to: string;
  label: string;
  /** Shown only to people with one of these roles (the server checks them again). */
  role?: Role | readonly Role[];
}

const navItems: NavItem[] = [
  { to: paths.home(), label: "Overview" },
  { to: paths.catalogue(), label: "Catalogue" },
  { to: paths.translate(), label: "Translate" },
  { to: paths.forecast(), label: "Forecast" },
  { to: paths.consistency(), label: "IMR consistency" },
  { to: paths.sheets(), label: "Sheets", role: "analyst" },
  { to: paths.mySubmissions(), label: "My submissions", role: ["contributor", "editor"] },
  { to: paths.reviewQueue(), label: "Review", role: "editor" },
  { to: paths.adminUsers(), label: "People", role: "admin" },
];

export function Layout() {
  const { hasRole } = useAuth();
  const visibleNav = navItems.filter((item) => !item.role || hasRole(item.role));
  const { pathname } = useLocation();
  // The phone menu is open on the page where it was opened: following a link closes it.
  const [openAt, setOpenAt] = useState<string | null>(null);
  const menuOpen = openAt === pathname;
  return (
    <div className="min-h-screen flex flex-col">
      <a
        href="#main"
        onClick={(e) => {
          e.preventDefault();
          document.getElementById("main")?.focus();
        }}
        className="sr-only focus:not-sr-only focus:absolute focus:left-3 focus:top-3 focus:z-30 focus:rounded focus:bg-paper focus:px-3 focus:py-2 focus:shadow"
      >
        Skip to the content
      </a>
      <DocumentTitle home="from deviations to couplings" />
      <LiveRegion />
      <header className="border-b border-paper-edge bg-paper-deep/60">
        <div className="mx-auto max-w-page px-4 sm:px-6 py-3 md:py-4 flex flex-wrap items-center md:items-baseline gap-x-8 gap-y-2">
          <NavLink to={paths.home()} className="no-underline text-ink hover:text-sea">
            <span className="text-2xl font-semibold tracking-tight">Dragoman</span>
            <span className="ml-3 text-sm italic text-ink-soft hidden lg:inline">from deviations to couplings</span>
          </NavLink>
          <div className="ml-auto flex items-center gap-2 md:order-last">
            <UserMenu />
            <button
              type="button"
              aria-expanded={menuOpen}
              aria-controls="main-nav"
              onClick={() => setOpenAt(menuOpen ? null : pathname)}
              className="md:hidden rounded border border-paper-edge px-3 py-1 text-[0.95rem] text-ink hover:bg-paper-edge/50"
            >
              Menu
            </button>
          </div>
          <nav
            id="main-nav"
            aria-label="Main"
            className={`${menuOpen ? "flex" : "hidden"} md:flex w-full md:w-auto flex-col md:flex-row gap-1 md:gap-5 text-[0.95rem] pb-2 md:pb-0`}
          >
            {visibleNav.map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                // Only the overview needs an exact match; the others stay marked on their sub-pages
                // (a theory page under Catalogue, a review under Review).
                end={item.to === paths.home()}
                className={({ isActive }) =>
                  `no-underline py-1 md:pb-1 md:py-0 border-l-2 pl-3 md:pl-0 md:border-l-0 md:border-b-2 ${isActive ? "border-sea text-sea" : "border-transparent text-ink-soft hover:text-sea"}`
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
        </div>
      </header>
      <main id="main" tabIndex={-1} className="flex-1 mx-auto w-full min-w-0 max-w-page px-4 sm:px-6 py-8 md:py-10 focus:outline-none">
        <ErrorBoundary>
          <Suspense fallback={<p className="text-ink-faint">Loading…</p>}>
            <Outlet />
          </Suspense>
        </ErrorBoundary>
      </main>
      <Footer />
    </div>
  );
}

function Footer() {
  const health = useHealth();
  const status = health.isPending ? "checking the server…" : health.data ? `server ${health.data.status}, database ${health.data.db}, v${health.data.version}` : "server unreachable";
  return (
    <footer className="border-t border-paper-edge text-sm text-ink-faint">
      <div className="mx-auto max-w-page px-4 sm:px-6 py-4 flex flex-wrap justify-between gap-x-6 gap-y-2">
        <span>Dragoman: a reviewed catalogue of theory mappings for tests of general relativity. Units: G = c = 1 unless stated.</span>
        <a href={apiPaths.openapi()}>API document (OpenAPI)</a>
        <span data-testid="server-status">{status}</span>
      </div>
    </footer>
  );
}
