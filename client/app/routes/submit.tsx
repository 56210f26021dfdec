import { useNavigate, useParams, useSearchParams } from "react-router-dom";
import { useAuth } from "../../features/auth/components/auth-context.tsx";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";
import { useSubmission } from "../../features/submissions/api/get-submission.ts";
import { useTargetEntry } from "../../features/submissions/api/get-target-entry.ts";
import { emptyEntry, toFormEntry } from "../../features/submissions/components/form-values.ts";
import { SubmissionComments } from "../../features/submissions/components/submission-comments.tsx";
import { SubmissionForm } from "../../features/submissions/components/submission-form.tsx";
import { WithdrawButton } from "../../features/submissions/components/withdraw-button.tsx";
import { Caution, ErrorNote, Loading } from "../../components/ui/states.tsx";
import { paths } from "../../lib/paths.ts";
import { statusLabel } from "../../../common/submission-status.ts";

/** States in which the author may still change and (re)send a submission. */
const AUTHOR_EDITABLE = new Set(["draft", "returned"]);
const EDITOR_EDITABLE = new Set(["submitted", "resubmitted", "in_review"]);
const WITHDRAWABLE = new Set(["draft", "submitted", "resubmitted", "returned"]);

function NewSubmission() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const target = params.get("target") ?? undefined;
  const entry = useTargetEntry(target);
  if (target && entry.isPending) return <Loading what={`the current entry “${target}”`} />;
  if (target && entry.isError) return <ErrorNote error={entry.error} title={`The entry “${target}” could not be loaded to start a change from.`} />;
  const initial = target && entry.data ? { target_slug: target, theory: toFormEntry(entry.data.entry) } : { theory: emptyEntry() };
  return (
    <>
      <h1 className="text-3xl mb-2">{target ? `Propose a change to “${target}”` : "Propose a new entry"}</h1>
      <p className="mb-4 max-w-prose text-ink-soft">
        {target
          ? `The form starts from revision ${entry.data?.revision ?? "?"}. Editors review the change and, when they accept it, publish it as the next revision.`
          : "Describe the theory, its couplings and how it maps onto a deviation parameter. Save a draft at any time; submit it when the checks pass."}
      </p>
      <SubmissionForm
        key={target ?? "new"}
        initial={initial}
        canSubmit
        onCreated={(id) => void navigate(paths.editSubmission(id), { replace: true })}
        onSubmitted={() => void navigate(paths.mySubmissions())}
      />
    </>
  );
}

function EditSubmission({ id }: { id: number }) {
  const navigate = useNavigate();
  const { user, hasRole } = useAuth();
  const sub = useSubmission(id);
  if (sub.isPending) return <Loading what={`submission ${id}`} />;
  if (sub.isError) return <ErrorNote error={sub.error} retry={() => void sub.refetch()} />;
  const s = sub.data;
  const isAuthor = user?.login === s.author.login;
  const editable = (isAuthor && AUTHOR_EDITABLE.has(s.status)) || (hasRole("editor") && EDITOR_EDITABLE.has(s.status));
  return (
    <>
      <h1 className="text-3xl mb-1" data-page-title={`Submission ${s.id}: ${s.name}`}>
        {s.name}
      </h1>
      <p className="mb-4 text-sm text-ink-soft tabular-nums">
        Submission {s.id} by {s.author.name} · {statusLabel(s.status)} · version {s.version}
        {s.target_slug ? ` · changes “${s.target_slug}”` : " · a new entry"}
      </p>
      <SubmissionComments id={s.id} />
      {isAuthor && WITHDRAWABLE.has(s.status) && (
        <div className="mb-4">
          <WithdrawButton id={s.id} onDone={() => void navigate(paths.mySubmissions())} />
        </div>
      )}
      {!editable && (
        <div className="mb-4">
          <Caution title="This submission cannot be changed now">
            It is {statusLabel(s.status)}. {isAuthor ? "You can change it again if an editor returns it." : "Only its author (or an editor, while it is under review) can change it."}
          </Caution>
        </div>
      )}
      <fieldset disabled={!editable} className="contents">
        <SubmissionForm
          key={`${s.id}`}
          id={s.id}
          version={s.version}
          status={s.status}
          initial={{ target_slug: s.target_slug ?? undefined, theory: toFormEntry(s.theory) }}
          checks={s.checks}
          canSubmit={isAuthor && AUTHOR_EDITABLE.has(s.status)}
          onSubmitted={() => void navigate(paths.mySubmissions())}
        />
      </fieldset>
    </>
  );
}

export function Component() {
  const { id } = useParams();
  const n = id === undefined ? undefined : Number(id);
  return (
    <RequireAuth role={["contributor", "editor"]}>
      {n === undefined ? <NewSubmission /> : Number.isInteger(n) && n > 0 ? <EditSubmission id={n} /> : <ErrorNote error={new Error(`“${id}” is not a submission number.`)} />}
    </RequireAuth>
  );
}
