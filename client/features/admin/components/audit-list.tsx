import { Empty, ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { useAudit } from "../api/get-audit.ts";
import { formatDateTime } from "../../../../common/dates.ts";

const list = (v: unknown) => (Array.isArray(v) ? (v.length ? v.join(", ") : "none") : JSON.stringify(v));

const actionWords: Record<string, string> = {
  "roles.set": "changed the roles of",
  "roles.granted_by_config": "granted admin (ADMIN_LOGINS) to",
};

/** The latest account changes: who did what to whom, with the roles before and after. */
export function AuditList({ limit = 20 }: { limit?: number }) {
  const audit = useAudit({ limit });
  if (audit.isPending) return <Loading what="the audit log" />;
  if (audit.isError) return <ErrorNote error={audit.error} retry={() => void audit.refetch()} />;
  if (audit.data.length === 0) return <Empty>No account changes yet.</Empty>;
  return (
    <ol className="space-y-2 text-[0.95rem]" data-testid="audit-list">
      {audit.data.map((e) => (
        <li key={e.id} className="border-l-2 border-sea/40 pl-3">
          <span className="text-ink-faint text-sm">{formatDateTime(e.at)}</span>{" "}
          <strong>{e.actor ?? "the configuration"}</strong> {actionWords[e.action] ?? e.action} <strong>{e.subject}</strong>:{" "}
          <span className="text-ink-soft">
            {list(e.before)} → {list(e.after)}
          </span>
        </li>
      ))}
    </ol>
  );
}
