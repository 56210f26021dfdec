import { createContext, useContext, useMemo, type ReactNode } from "react";
import { useMe, type Me, type Role } from "../api/get-me.ts";

export interface Auth {
  /** undefined while the first answer is on its way; null for a visitor. */
  user: Me | null | undefined;
  isPending: boolean;
  /** Set when the server could not say who is signed in (down, unreachable). */
  error: Error | null;
  /** Explicit roles only: admin does not imply editor (the server checks the same way). */
  hasRole: (role: Role | readonly Role[]) => boolean;
}

const AuthContext = createContext<Auth | undefined>(undefined);

/** Makes the signed-in person available to every route; the data itself lives in the ['me'] query. */
export function AuthProvider({ children }: { children: ReactNode }) {
  const me = useMe();
  const user = me.data;
  const value = useMemo<Auth>(
    () => ({
      user,
      isPending: me.isPending,
      error: me.error,
      hasRole: (role) => {
        const wanted: readonly Role[] = typeof role === "string" ? [role] : role;
        return !!user && wanted.some((r) => user.roles.includes(r));
      },
    }),
    [user, me.isPending, me.error],
  );
  return <AuthContext.Provider value={value}>{children}</AuthContext.Provider>;
}

export function useAuth(): Auth {
  const auth = useContext(AuthContext);
  if (!auth) throw new Error("useAuth needs <AuthProvider> above it (client/app/router.tsx puts it around the layout)");
  return auth;
}
