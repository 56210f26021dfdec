import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { DataTable } from "../../../components/ui/data-table.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ADMIN_ROLE_NAMES, type AdminRole, type AdminUser } from "../api/get-users.ts";
import { useSetRoles } from "../api/set-roles.ts";
import { formatDate } from "../../../../common/dates.ts";

const column = createColumnHelper<AdminUser>();

const when = (iso: string | null) => (iso ? formatDate(iso) : "never");

const roleHint: Record<AdminRole, string> = {
  contributor: "submits theory mappings",
  analyst: "saves result sheets and scripts the API",
  editor: "reviews and publishes",
  admin: "manages people and roles",
};

function RoleToggles({ user, busy, onChange }: { user: AdminUser; busy: boolean; onChange: (roles: AdminRole[]) => void }) {
  return (
    <div className="flex flex-wrap gap-x-4 gap-y-1" role="group" aria-label={`Roles of ${user.login}`}>
      {ADMIN_ROLE_NAMES.map((role) => {
        const on = user.roles.includes(role);
        return (
          <label key={role} title={roleHint[role]} className={`inline-flex items-center gap-1.5 text-sm ${on ? "text-ink" : "text-ink-faint"}`}>
            <input
              type="checkbox"
              checked={on}
              disabled={busy}
              data-testid={`role-${user.login}-${role}`}
              onChange={() => onChange(on ? user.roles.filter((r) => r !== role) : [...user.roles, role])}
              className="accent-sea"
            />
            {role}
          </label>
        );
      })}
    </div>
  );
}

/** Everyone with an account, sortable by any column; ticking a role saves it at once (and is audited). */
export function UsersTable({ users, afterChange }: { users: AdminUser[]; afterChange?: (login: string) => Promise<unknown> }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "login", desc: false }]);
  const setRoles = useSetRoles({ afterChange });
  const pendingLogin = setRoles.isPending ? setRoles.variables.login : undefined;

  const columns = useMemo(
    () => [
      column.accessor("login", { header: "Login", cell: (c) => <span className="font-mono text-sm">{c.getValue()}</span> }),
      column.accessor("name", { header: "Name" }),
      column.accessor((u) => u.roles.join(","), {
        id: "roles",
        header: "Roles",
        cell: (c) => (
          <RoleToggles user={c.row.original} busy={pendingLogin === c.row.original.login} onChange={(roles) => setRoles.mutate({ login: c.row.original.login, roles })} />
        ),
      }),
      column.accessor("last_sign_in_at", {
        header: "Last sign-in",
        cell: (c) => when(c.getValue()),
        sortingFn: "datetime",
        sortUndefined: "last",
      }),
      column.accessor("created_at", { header: "Joined", cell: (c) => when(c.getValue()) }),
    ],
    [pendingLogin, setRoles],
  );

  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: users,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div className="space-y-3">
      {setRoles.isError && <ErrorNote title={`The roles of ${setRoles.variables?.login ?? "that person"} were not changed.`} error={setRoles.error} />}
      <DataTable table={table} caption="People with an account and their roles" rowTestId={(u) => `user-row-${u.login}`} empty="Nobody has signed in yet." />
    </div>
  );
}
