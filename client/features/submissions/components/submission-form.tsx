import { zodResolver } from "@hookform/resolvers/zod";
import { useQueryClient } from "@tanstack/react-query";
import { useState, type ReactNode } from "react";
import { FormProvider, useForm } from "react-hook-form";
import { createSubmissionSchema, type ChecksReport, type SubmissionStatus } from "../../../../common/catalogue.ts";
import { Button } from "../../../components/ui/button.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { submissionQuery } from "../api/get-submission.ts";
import { useSaveSubmission, useSubmitSubmission } from "../api/save-submission.ts";
import { isStaleVersion, newerVersion } from "./conflict.ts";
import { CouplingsFields } from "./couplings-fields.tsx";
import { DefinitionsFields } from "./definitions-fields.tsx";
import { EntryFields } from "./entry-fields.tsx";
import { toFormEntry, type SubmissionFormInput, type SubmissionFormOutput } from "./form-values.ts";
import { MappingsFields } from "./mappings-fields.tsx";
import { ReferencesFields } from "./references-fields.tsx";
import { SavedChecks } from "./save-summary.tsx";
import { applyServerErrors, fieldsOf, flattenErrors, type UnplacedError } from "./server-errors.ts";
import { statusLabel } from "../../../../common/submission-status.ts";

export interface SubmissionFormProps {
  id?: number | undefined;
  version?: number | undefined;
  status?: SubmissionStatus | undefined;
  initial: SubmissionFormInput;
  checks?: ChecksReport | undefined;
  /** The author may send it to review; an editor editing someone's submission may only save. */
  canSubmit: boolean;
  onCreated?: (id: number) => void;
  onSubmitted?: (id: number) => void;
}

function Section({ title, hint, children }: { title: string; hint?: string; children: ReactNode }) {
  return (
    <section className="mt-8">
      <h2 className="text-xl border-b border-paper-edge pb-1 mb-1">{title}</h2>
      {hint && <p className="mb-3 text-sm text-ink-soft max-w-prose">{hint}</p>}
      {children}
    </section>
  );
}

export function SubmissionForm(props: SubmissionFormProps) {
  const qc = useQueryClient();
  const form = useForm<SubmissionFormInput, unknown, SubmissionFormOutput>({
    resolver: zodResolver(createSubmissionSchema),
    defaultValues: props.initial,
    mode: "onTouched",
  });
  const save = useSaveSubmission();
  const submit = useSubmitSubmission();
  const [id, setId] = useState(props.id);
  const [version, setVersion] = useState(props.version);
  const [checks, setChecks] = useState(props.checks);
  const [unplaced, setUnplaced] = useState<UnplacedError[]>([]);
  const [conflict, setConflict] = useState<number | undefined>();
  const [stash, setStash] = useState<SubmissionFormInput | undefined>();
  // A "saved" notice describes the form as it was saved, so it goes once the form is edited again;
  // other notices (a loaded version, edits brought back, a refused save) stay until the next action.
  const [notice, setNotice] = useState<{ text: string; untilEdited: boolean } | undefined>();
  const [failure, setFailure] = useState<unknown>();

  async function persist(values: SubmissionFormOutput, opts: { overVersion?: number; announceCreated?: boolean } = {}): Promise<number | undefined> {
    setUnplaced([]);
    setFailure(undefined);
    setNotice(undefined);
    try {
      const saved = await save.mutateAsync({ id, version: opts.overVersion ?? version, body: values });
      setId(saved.id);
      setVersion(saved.version);
      setChecks(saved.checks);
      setConflict(undefined);
      // The saved values become the new baseline, so "unsaved changes" means changes since this save.
      form.reset(form.getValues(), { keepValues: true });
      setNotice({ text: `Saved as version ${saved.version}.`, untilEdited: true });
      if (id === undefined && opts.announceCreated !== false) props.onCreated?.(saved.id);
      return saved.id;
    } catch (err) {
      if (isStaleVersion(err)) {
        setConflict(newerVersion(err));
        return undefined;
      }
      setUnplaced(applyServerErrors(err, form.setError));
      // Field errors are shown on their fields and in the summary; anything else is shown as a failure.
      if (Object.keys(fieldsOf(err)).length === 0) setFailure(err);
      return undefined;
    }
  }

  // Refused before sending (the summary at the top lists why): say so, instead of leaving an older "saved" notice up.
  const onInvalid = () => setNotice({ text: "Not saved: fix the problems listed at the top of the form.", untilEdited: false });
  const onSave = form.handleSubmit((values) => persist(values), onInvalid);
  const onSubmitForReview = form.handleSubmit(async (values) => {
    // An unchanged, already saved submission is sent as it is: saving again would only bump its version.
    const saved = id !== undefined && !form.formState.isDirty ? id : await persist(values, { announceCreated: false });
    if (saved === undefined) return;
    try {
      await submit.mutateAsync(saved);
      props.onSubmitted?.(saved);
    } catch (err) {
      setFailure(err);
    }
  }, onInvalid);

  async function loadNewer() {
    if (id === undefined) return;
    setStash(form.getValues());
    const fresh = await qc.fetchQuery({ ...submissionQuery(id), staleTime: 0 });
    form.reset({ target_slug: fresh.target_slug ?? undefined, theory: toFormEntry(fresh.theory) });
    setVersion(fresh.version);
    setChecks(fresh.checks);
    setConflict(undefined);
    setNotice({ text: `Loaded version ${fresh.version}. Your edits are kept: you can bring them back.`, untilEdited: false });
  }

  const clientErrors = flattenErrors(form.formState.errors);
  const allErrors = [...clientErrors, ...unplaced.filter((u) => !clientErrors.some((c) => c.path === u.path))];
  const dirty = form.formState.isDirty;
  const busy = save.isPending || submit.isPending || form.formState.isSubmitting;

  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={(e) => void onSave(e)} aria-label="Theory entry" >
        {allErrors.length > 0 && (
          <div role="alert" className="mb-6 rounded border border-brick/40 bg-brick-wash p-3 text-sm" data-testid="error-summary">
            <p className="font-semibold text-brick">
              {allErrors.length} problem{allErrors.length === 1 ? "" : "s"} to fix before this can be saved:
            </p>
            <ul className="mt-1 list-disc pl-5">
              {allErrors.map((e) => (
                <li key={e.path}>
                  <span className="font-mono text-xs">{e.path.replace(/^theory\./, "")}</span>: {e.message}
                </li>
              ))}
            </ul>
          </div>
        )}
        <Section title="The entry">
          <EntryFields lockSlug={Boolean(props.initial.target_slug)} />
        </Section>
        <Section title="Couplings" hint="Each coupling with its dimension as a power of length in geometric units, so the engine can check every expression's dimensions.">
          <CouplingsFields />
        </Section>
        <Section title="Definitions" hint="Shorthands the mappings use. The engine substitutes them before checking.">
          <DefinitionsFields />
        </Section>
        <Section title="Mappings" hint="How the theory maps onto a deviation parameter. Each expression is rendered and checked by the engine as you type (symbols, dimensions, GR limit, PN order).">
          <MappingsFields />
        </Section>
        <Section title="References" hint="Every formula carries its source. arXiv ids like 2104.11189 or gr-qc/0512160; DOIs like 10.1103/…">
          <ReferencesFields />
        </Section>
        {checks && (
          <Section title="Checks at the last save">
            <SavedChecks checks={checks} />
          </Section>
        )}
        <div className="sticky bottom-0 z-10 -mx-4 sm:-mx-6 mt-10 border-t border-paper-edge bg-paper-deep/95 backdrop-blur-sm">
          <div className="flex flex-wrap items-center gap-3 px-6 py-3">
            <Button type="submit" kind="secondary" busy={save.isPending && !submit.isPending}>
              Save draft
            </Button>
            {props.canSubmit && (
              <Button kind="primary" busy={submit.isPending} disabled={busy} onClick={() => void onSubmitForReview()}>
                {props.status === "returned" ? "Send back for review" : "Submit for review"}
              </Button>
            )}
            <span className="text-sm text-ink-soft tabular-nums" data-testid="form-status" role="status">
              {id !== undefined ? `Submission ${id}, version ${version ?? "?"}` : "Not saved yet"}
              {props.status ? ` · ${statusLabel(props.status)}` : ""}
              {dirty ? " · unsaved changes" : ""}
              {notice && !(notice.untilEdited && dirty) ? ` · ${notice.text}` : ""}
            </span>
            {stash && (
              <Button
                kind="quiet"
                onClick={() => {
                  form.reset(stash, { keepDefaultValues: true });
                  setStash(undefined);
                  setNotice({ text: `Your edits are back, on top of version ${version ?? "?"}; saving now replaces that version.`, untilEdited: false });
                }}
              >
                Bring back my edits
              </Button>
            )}
          </div>
          {conflict !== undefined && (
            <div role="alert" className="px-6 pb-3" data-testid="conflict">
              <div className="rounded border border-amber/50 bg-amber-wash p-3 text-sm">
                <p className="font-semibold text-amber">A newer version {conflict} exists.</p>
                <p className="mt-1">Someone saved this submission after you opened it. Nothing is lost: your edits are still in the form.</p>
                <div className="mt-2 flex flex-wrap gap-3">
                  <Button onClick={() => void loadNewer()}>Load version {conflict} (keep my edits aside)</Button>
                  <Button kind="danger" onClick={() => void form.handleSubmit((v) => persist(v, { overVersion: conflict }))()}>
                    Save mine over version {conflict}
                  </Button>
                </div>
              </div>
            </div>
          )}
          {failure !== undefined && (
            <div className="px-6 pb-3">
              <ErrorNote error={failure} title="The server refused this." />
            </div>
          )}
        </div>
      </form>
    </FormProvider>
  );
}
