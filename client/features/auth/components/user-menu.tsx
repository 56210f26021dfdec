import { useEffect, useId, useRef, useState } from "react";
import { Link, useLocation, useNavigate } from "react-router-dom";
import { paths } from "../../../lib/paths.ts";
import { useSignOut } from "../api/sign-out.ts";
import { useAuth } from "./auth-context.tsx";
import { SignInButton } from "./sign-in-button.tsx";

const roleWords = (roles: readonly string[]) => (roles.length ? roles.join(", ") : "reader");

/** The header's corner: a sign-in button for visitors, otherwise the person's name opening a small menu. */
export function UserMenu() {
  const { user, isPending } = useAuth();
  const [open, setOpen] = useState(false);
  const signOut = useSignOut();
  const navigate = useNavigate();
  const location = useLocation();
  const menuId = useId();
  const box = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!open) return;
    const close = (e: MouseEvent | KeyboardEvent) => {
      if (e instanceof KeyboardEvent ? e.key === "Escape" : !box.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener("mousedown", close);
    document.addEventListener("keydown", close);
    return () => {
      document.removeEventListener("mousedown", close);
      document.removeEventListener("keydown", close);
    };
  }, [open]);

  if (isPending) return <span className="text-sm text-ink-faint">…</span>;
  // The sign-in page has its own, larger button.
  if (!user) return location.pathname === "/sign-in" ? null : <SignInButton />;

  return (
    <div ref={box} className="relative">
      <button
        type="button"
        data-testid="user-menu"
        aria-haspopup="true"
        aria-expanded={open}
        aria-controls={menuId}
        onClick={() => setOpen((o) => !o)}
        className="inline-flex items-baseline gap-2 rounded px-2 py-1 text-[0.95rem] text-ink hover:bg-paper-edge/50"
      >
        <span className="font-semibold">{user.name}</span>
        <span className="text-xs text-ink-faint" aria-hidden="true">
          ▾
        </span>
      </button>
      {open && (
        <div id={menuId} className="absolute right-0 z-20 mt-1 w-64 rounded border border-paper-edge bg-paper p-3 shadow-md" data-testid="user-menu-panel">
          <p className="font-semibold">{user.name}</p>
          <p className="text-sm text-ink-soft">@{user.login}</p>
          <p className="mt-2 text-sm">
            <span className="text-ink-faint">Roles: </span>
            <span data-testid="user-roles">{roleWords(user.roles)}</span>
          </p>
          <Link to={paths.apiTokens()} onClick={() => setOpen(false)} className="mt-3 block text-sm" data-testid="api-tokens-link">
            API tokens
          </Link>
          {signOut.isError && <p className="mt-2 text-sm text-brick">Signing out failed: {signOut.error.message}</p>}
          <button
            type="button"
            data-testid="sign-out"
            disabled={signOut.isPending}
            onClick={() =>
              signOut.mutate(undefined, {
                onSuccess: () => {
                  setOpen(false);
                  void navigate(paths.home());
                },
              })
            }
            className="mt-3 w-full rounded border border-brick/50 px-3 py-1 text-sm font-semibold text-brick hover:bg-brick-wash disabled:opacity-50"
          >
            {signOut.isPending ? "Signing out…" : "Sign out"}
          </button>
        </div>
      )}
    </div>
  );
}
