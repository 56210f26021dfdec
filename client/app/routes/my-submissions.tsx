import { Link } from "react-router-dom";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";
import { useMySubmissions } from "../../features/submissions/api/get-my-submissions.ts";
import { MySubmissionsTable } from "../../features/submissions/components/my-submissions-table.tsx";
import { SubmissionComments } from "../../features/submissions/components/submission-comments.tsx";
import { ErrorNote, Loading } from "../../components/ui/states.tsx";
import { paths } from "../../lib/paths.ts";

function MySubmissions() {
  const list = useMySubmissions();
  if (list.isPending) return <Loading what="your submissions" />;
  if (list.isError) return <ErrorNote error={list.error} retry={() => void list.refetch()} />;
  const returned = list.data.submissions.filter((s) => s.status === "returned");
  return (
    <>
      <MySubmissionsTable submissions={list.data.submissions} />
      {returned.length > 0 && (
        <section className="mt-10">
          <h2 className="text-xl mb-3">Returned to you</h2>
          {returned.map((s) => (
            <div key={s.id} className="mb-4">
              <p className="mb-1">
                <Link to={paths.editSubmission(s.id)} className="font-semibold">
                  {s.name}
                </Link>{" "}
                <span className="text-sm text-ink-soft tabular-nums">version {s.version}</span>
              </p>
              <SubmissionComments id={s.id} />
            </div>
          ))}
        </section>
      )}
    </>
  );
}

export function Component() {
  return (
    <RequireAuth role={["contributor", "editor"]}>
      <div className="flex flex-wrap items-baseline justify-between gap-4 mb-4">
        <h1 className="text-3xl">My submissions</h1>
        <Link to={paths.submit()}>Propose a new entry</Link>
      </div>
      <MySubmissions />
    </RequireAuth>
  );
}
