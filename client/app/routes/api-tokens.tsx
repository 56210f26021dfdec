import { ApiTokensPanel } from "../../features/auth/components/api-tokens-panel.tsx";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";

export function Component() {
  return (
    <RequireAuth>
      <section className="max-w-4xl">
        <h1 className="text-3xl mb-2">API tokens</h1>
        <p className="mb-6 text-ink-soft">
          Scripts and notebooks call the Dragoman API with a personal token instead of a browser session. Revoke a token as soon as it
          is no longer needed or may have leaked; revocation applies to the very next request.
        </p>
        <ApiTokensPanel />
      </section>
    </RequireAuth>
  );
}
