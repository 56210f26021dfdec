import { Link, useSearchParams } from "react-router-dom";
import { paths } from "../../../lib/paths.ts";
import { useAuth } from "./auth-context.tsx";
import { SignInButton } from "./sign-in-button.tsx";

/** The 403 page: which role the page needs, which roles you have, and who can change that. */
export function ForbiddenPanel() {
  const [params] = useSearchParams();
  const { user } = useAuth();
  const role = params.get("role");
  return (
    <section className="max-w-xl" data-testid="forbidden">
      <h1 className="text-3xl mb-4">Not open to you</h1>
      <p className="mb-3 text-lg">{role ? <>This page needs the <strong>{role}</strong> role.</> : "This page needs a role you do not have."}</p>
      {user ? (
        <p className="mb-6 text-ink-soft">
          You are signed in as {user.name} (@{user.login}) with {user.roles.length ? <>the roles {user.roles.join(", ")}</> : "no role beyond reader"}. An admin can
          grant roles.
        </p>
      ) : (
        <div className="mb-6">
          <p className="mb-3 text-ink-soft">You are not signed in.</p>
          <SignInButton returnTo={paths.home()} />
        </div>
      )}
      <Link to={paths.home()}>Back to the overview</Link>
    </section>
  );
}
