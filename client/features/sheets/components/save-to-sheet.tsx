import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { Link, useLocation } from "react-router-dom";
import { z } from "zod";
import { sheetRecordInputSchema, translationRecordInputSchema, type Sheet, type SheetRecordFormInput } from "../../../../common/sheets.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { paths } from "../../../lib/paths.ts";
import { useAuth } from "../../auth/components/auth-context.tsx";
import { useAppendRecord } from "../api/append-record.ts";
import { useCreateSheet } from "../api/create-sheet.ts";
import { useSheets } from "../api/get-sheets.ts";

const NEW = "new";

type Provenance = "label" | "detector_network" | "analysis_method" | "data_link" | "notes";
type Omit2<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;

/**
 * What a record holds besides its provenance: `{ kind: "translation", bound, binary, ... }`,
 * `{ kind: "samples_job", job }`, `{ kind: "stack", job }`, or `{ kind: "consistency", summaries }`
 * / `{ kind: "consistency", job }`. The server computes or copies the result when it saves it.
 */
export type RecordPayload = Omit2<SheetRecordFormInput, Provenance>;

const provenanceSchema = translationRecordInputSchema
  .pick({ label: true, detector_network: true, analysis_method: true, data_link: true, notes: true })
  .extend({ target: z.string(), new_name: z.string().trim().max(200) })
  .refine((v) => v.target !== NEW || v.new_name.length > 0, { path: ["new_name"], message: "name the new sheet" });
type ProvenanceInput = z.input<typeof provenanceSchema>;
type ProvenanceOutput = z.output<typeof provenanceSchema>;

interface Props {
  payload: RecordPayload;
  /** What is saved, for the heading: "this translation", "this samples result". */
  what: string;
  /** Suggested provenance (e.g. the file name as the label). */
  defaults?: Partial<Record<Provenance, string>>;
}

/**
 * "Save to sheet": a result, with where it came from, into one of your sheets (or a new one).
 * Reusable for every record kind; for people without the analyst role it says how to get there.
 * The record is stored as the server computes it now and never recomputed behind the reader's back.
 */
export function SaveToSheet(props: Props) {
  const { user, hasRole } = useAuth();
  const location = useLocation();
  if (!hasRole("analyst")) {
    return (
      <p className="text-sm text-ink-faint" data-testid="save-to-sheet-gate">
        {user ? (
          `Saving ${props.what} to a sheet needs the analyst role.`
        ) : (
          <>
            Sign in with the analyst role to save {props.what} to a sheet (<Link to={paths.signIn({ returnTo: location.pathname + location.search })}>sign in</Link>).
          </>
        )}
      </p>
    );
  }
  return <SaveForm {...props} />;
}

function SaveForm({ payload, what, defaults = {} }: Props) {
  const titleId = useId();
  const sheets = useSheets();
  const append = useAppendRecord();
  const create = useCreateSheet();
  const [saved, setSaved] = useState<Sheet | undefined>();
  const form = useForm<ProvenanceInput, unknown, ProvenanceOutput>({
    resolver: zodResolver(provenanceSchema),
    defaultValues: { label: "", detector_network: "", analysis_method: "", data_link: "", notes: "", ...defaults, target: NEW, new_name: "" },
  });
  const { register, handleSubmit, formState } = form;
  const error = append.error ?? create.error;
  const serverFields = error instanceof ApiError ? error.fields : {};
  const fieldError = (name: keyof ProvenanceOutput) => formState.errors[name]?.message ?? serverFields[`record.${name}`] ?? serverFields[`records.0.${name}`] ?? serverFields[name];
  // A refusal about the result itself (an expired job, a bad estimate) is not one of the form's fields.
  const otherFields = Object.entries(serverFields).filter(([k]) => !/^(records\.0\.|record\.)?(label|detector_network|analysis_method|data_link|notes|new_name|name)$/.test(k));

  const onSubmit = (v: ProvenanceOutput) => {
    const record = sheetRecordInputSchema.parse({
      ...payload,
      label: v.label,
      detector_network: v.detector_network,
      analysis_method: v.analysis_method,
      data_link: v.data_link,
      notes: v.notes,
    });
    setSaved(undefined);
    append.reset();
    create.reset();
    if (v.target === NEW) create.mutate({ name: v.new_name, description: "", records: [record] }, { onSuccess: setSaved });
    else append.mutate({ sheetId: Number(v.target), record }, { onSuccess: setSaved });
  };

  return (
    <section aria-labelledby={titleId} className="rounded border border-sea/30 bg-sea-wash/40 p-4" data-testid="save-to-sheet">
      <h3 id={titleId} className="mb-1 text-lg">
        Save {what} to a sheet
      </h3>
      <p className="mb-3 text-sm text-ink-soft">The sheet keeps the result exactly as it is now, with the inputs and versions it came from.</p>
      <form onSubmit={handleSubmit(onSubmit)} noValidate className="grid gap-3 sm:grid-cols-3">
        <Field label="Event or analysis label" error={fieldError("label")}>
          {(c) => <TextInput {...c} {...register("label")} placeholder="e.g. KV-231107a" />}
        </Field>
        <Field label="Detector network" error={fieldError("detector_network")}>
          {(c) => <TextInput {...c} {...register("detector_network")} />}
        </Field>
        <Field label="Analysis method" error={fieldError("analysis_method")}>
          {(c) => <TextInput {...c} {...register("analysis_method")} />}
        </Field>
        <Field label="Data link" hint="http(s) address of the posterior or data release" error={fieldError("data_link")}>
          {(c) => <TextInput {...c} type="url" {...register("data_link")} />}
        </Field>
        <Field label="Sheet" error={fieldError("target")}>
          {(c) => (
            <Select {...c} {...register("target")}>
              <option value={NEW}>a new sheet…</option>
              {sheets.data?.sheets.map((s) => (
                <option key={s.id} value={String(s.id)}>
                  {s.name}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="New sheet's name" error={fieldError("new_name") ?? serverFields.name}>
          {(c) => <TextInput {...c} {...register("new_name")} />}
        </Field>
        <div className="flex flex-wrap items-baseline gap-4 sm:col-span-3">
          <Button type="submit" kind="primary" busy={append.isPending || create.isPending} data-testid="save-record">
            Save
          </Button>
          {saved && (
            <p className="text-sm text-moss" role="status">
              Saved to <Link to={paths.sheet(saved.id)}>{saved.name}</Link> (version {saved.version}).
            </p>
          )}
        </div>
      </form>
      {error && (Object.keys(serverFields).length === 0 || otherFields.length > 0) && <ErrorNote error={error} title="The record was not saved." />}
    </section>
  );
}
