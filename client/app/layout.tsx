import { Suspense } from "react";
import { NavLink, Outlet } from "react-router-dom";
import type { Role } from "../features/auth/api/get-me.ts";
import { useAuth } from "../features/auth/components/auth-context.tsx";
import { UserMenu } from "../features/auth/components/user-menu.tsx";
import { useHealth } from "../features/platform/api/get-health.ts";
import { paths } from "../lib/paths.ts";
import { ErrorBoundary } from "../components/ui/error-boundary.tsx";

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
  { to: paths.sheets(), label: "Sheets", role: "analyst" },
  { to: paths.mySubmissions(), label: "My submissions", role: ["contributor", "editor"] },
  { to: paths.reviewQueue(), label: "Review", role: "editor" },
  { to: paths.adminUsers(), label: "People", role: "admin" },
];

export function Layout() {
  const { hasRole } = useAuth();
  const visibleNav = navItems.filter((item) => !item.role || hasRole(item.role));
  return (
    <div className="min-h-screen flex flex-col">
      <header className="border-b border-paper-edge bg-paper-deep/60">
        <div className="mx-auto max-w-page px-6 py-4 flex items-baseline gap-8">
          <NavLink to={paths.home()} className="no-underline text-ink hover:text-sea">
            <span className="text-2xl font-semibold tracking-tight">Dragoman</span>
            <span className="ml-3 text-sm italic text-ink-soft hidden sm:inline">from deviations to couplings</span>
          </NavLink>
          <nav aria-label="Main" className="flex gap-5 text-[0.95rem]">
            {visibleNav.map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                // Only the overview needs an exact match; the others stay marked on their sub-pages
                // (a theory page under Catalogue, a review under Review).
                end={item.to === paths.home()}
                className={({ isActive }) =>
                  `no-underline pb-1 border-b-2 ${isActive ? "border-sea text-sea" : "border-transparent text-ink-soft hover:text-sea"}`
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto self-center">
            <UserMenu />
          </div>
        </div>
      </header>
      <main className="flex-1 mx-auto w-full max-w-page px-6 py-10">
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
      <div className="mx-auto max-w-page px-6 py-4 flex flex-wrap justify-between gap-2">
        <span>Dragoman: a reviewed catalogue of theory mappings for tests of general relativity. Units: G = c = 1 unless stated.</span>
        <span data-testid="server-status">{status}</span>
      </div>
    </footer>
  );
}
