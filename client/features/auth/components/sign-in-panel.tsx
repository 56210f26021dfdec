import { Navigate, useSearchParams } from "react-router-dom";
import { useAuth } from "./auth-context.tsx";
import { SignInButton } from "./sign-in-button.tsx";
import { signInErrorSentence } from "./sign-in-errors.ts";

const safePath = (p: string | null) => (p && p.startsWith("/") && !p.startsWith("//") && !p.startsWith("/\\") ? p : "/");

/** The sign-in page: why you are here (a page that needs it, or a sign-in that failed) and the way in. */
export function SignInPanel() {
  const [params] = useSearchParams();
  const { user } = useAuth();
  const returnTo = safePath(params.get("return_to"));
  const error = signInErrorSentence(params.get("error"));
  if (user && !error) return <Navigate replace to={returnTo} />;

  return (
    <section className="max-w-xl">
      <h1 className="text-3xl mb-4">Sign in</h1>
      {error && (
        <div role="alert" data-testid="sign-in-error" className="mb-5 rounded border border-brick/40 bg-brick-wash p-3">
          {/* A failed attempt leaves an existing session alone: a forged callback link must not sign people out. */}
          <p className="font-semibold text-brick">{user ? `That sign-in did not work; you are still signed in as ${user.name}.` : "You are not signed in."}</p>
          <p className="text-ink-soft mt-1">{error}</p>
        </div>
      )}
      {!error && returnTo !== "/" && <p className="mb-4 text-ink-soft">That page is for signed-in people. Sign in and you will be taken back to it.</p>}
      <p className="mb-6 leading-relaxed">
        Dragoman uses your GitHub account to know who you are. Reading the catalogue needs no account; submitting mappings, reviewing them,
        saving result sheets and API tokens do.
      </p>
      <SignInButton returnTo={returnTo} large />
    </section>
  );
}
