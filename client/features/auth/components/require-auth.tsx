import type { ReactNode } from "react";
import { Navigate, useLocation } from "react-router-dom";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { paths } from "../../../lib/paths.ts";
import type { Role } from "../api/get-me.ts";
import { useAuth } from "./auth-context.tsx";

/**
 * Wraps a page that needs a signed-in person (and optionally one of some roles). A visitor goes to
 * sign in and comes back here afterwards; a person without the role sees the 403 page naming it.
 * The server enforces the same rules; this only spares people pages that would refuse them.
 */
export function RequireAuth({ role, children }: { role?: Role | readonly Role[]; children: ReactNode }) {
  const { user, isPending, error, hasRole } = useAuth();
  const location = useLocation();
  if (isPending) return <p className="text-ink-faint">Checking who you are…</p>;
  // Not knowing is not the same as being a visitor: do not bounce a signed-in person to sign in.
  if (error) return <ErrorNote title="Could not check who you are." error={error} />;
  if (!user) return <Navigate replace to={paths.signIn({ returnTo: location.pathname + location.search })} />;
  if (role && !hasRole(role)) {
    const needed = typeof role === "string" ? role : role.join(" or ");
    return <Navigate replace to={paths.forbidden(needed)} />;
  }
  return <>{children}</>;
}
