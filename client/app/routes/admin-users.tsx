import { useQueryClient } from "@tanstack/react-query";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { AuditList } from "../../features/admin/components/audit-list.tsx";
import { UsersTable } from "../../features/admin/components/users-table.tsx";
import { useAdminUsers } from "../../features/admin/api/get-users.ts";
import { meQuery } from "../../features/auth/api/get-me.ts";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";

function PeoplePage() {
  const users = useAdminUsers();
  const { user } = useAuth();
  const queryClient = useQueryClient();
  // Changing your own roles changes what the header may show you.
  const afterChange = async (login: string) => {
    if (login === user?.login) await queryClient.invalidateQueries({ queryKey: meQuery().queryKey });
  };
  return (
    <div className="space-y-10">
      <section>
        <h1 className="text-3xl mb-2">People and roles</h1>
        <p className="mb-5 max-w-3xl text-ink-soft">
          Tick a role to grant it, untick to take it away; each change is saved at once and written to the audit log below. Roles do not
          imply one another: an admin who also reviews needs the editor role too. The last admin cannot give up the admin role.
        </p>
        {users.isPending ? <Loading what="people" /> : users.isError ? <ErrorNote error={users.error} retry={() => void users.refetch()} /> : <UsersTable users={users.data} afterChange={afterChange} />}
      </section>
      <section>
        <h2 className="text-xl mb-3">Recent account changes</h2>
        <AuditList />
      </section>
    </div>
  );
}

export function Component() {
  return (
    <RequireAuth role="admin">
      <PeoplePage />
    </RequireAuth>
  );
}
