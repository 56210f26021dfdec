import { useLocation } from "react-router-dom";
import { apiPaths } from "../../../lib/paths.ts";

/**
 * A plain link, not a fetch: signing in is a full-page trip to GitHub and back. It brings the visitor
 * back to the page they were on, or to `returnTo`.
 */
export function SignInButton({ returnTo, label = "Sign in with GitHub", large = false }: { returnTo?: string; label?: string; large?: boolean }) {
  const location = useLocation();
  // From the sign-in or 403 page itself, coming back there would be pointless.
  const here = location.pathname === "/sign-in" || location.pathname === "/forbidden" ? "/" : location.pathname + location.search;
  return (
    <a
      href={apiPaths.githubSignIn({ returnTo: returnTo ?? here })}
      data-testid="sign-in"
      className={`inline-flex items-center rounded border border-sea bg-sea font-semibold text-paper no-underline hover:bg-sea-light hover:text-paper ${large ? "px-4 py-2 text-base" : "px-3 py-1 text-sm"}`}
    >
      {label}
    </a>
  );
}
