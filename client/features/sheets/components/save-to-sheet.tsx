import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Link } from "react-router-dom";
import { z } from "zod";
import type { PhaseConvertRequest } from "../../../../common/convert.ts";
import { sheetRecordInputSchema, type Sheet } from "../../../../common/sheets.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { paths } from "../../../lib/paths.ts";
import { useAppendRecord } from "../api/append-record.ts";
import { useCreateSheet } from "../api/create-sheet.ts";
import { useSheets } from "../api/get-sheets.ts";

const NEW = "new";

const provenanceSchema = sheetRecordInputSchema
  .pick({ label: true, detector_network: true, analysis_method: true, data_link: true, notes: true })
  .extend({ target: z.string(), new_name: z.string().trim().max(200) })
  .refine((v) => v.target !== NEW || v.new_name.length > 0, { path: ["new_name"], message: "name the new sheet" });
type ProvenanceInput = z.input<typeof provenanceSchema>;
type Provenance = z.output<typeof provenanceSchema>;

/** Saves the translated bound, with where it came from, into one of your sheets (or a new one). */
export function SaveToSheet({ request }: { request: PhaseConvertRequest }) {
  const sheets = useSheets();
  const append = useAppendRecord();
  const create = useCreateSheet();
  const [saved, setSaved] = useState<Sheet | undefined>();
  const form = useForm<ProvenanceInput, unknown, Provenance>({
    resolver: zodResolver(provenanceSchema),
    defaultValues: { label: "", detector_network: "", analysis_method: "", data_link: "", notes: "", target: NEW, new_name: "" },
  });
  const { register, handleSubmit, formState } = form;
  const error = append.error ?? create.error;
  const serverFields = error instanceof ApiError ? error.fields : {};
  const fieldError = (name: keyof Provenance) => formState.errors[name]?.message ?? serverFields[`records.0.${name}`] ?? serverFields[name];

  const onSubmit = (v: Provenance) => {
    const record = {
      label: v.label,
      detector_network: v.detector_network,
      analysis_method: v.analysis_method,
      data_link: v.data_link,
      notes: v.notes,
      bound: request.bound,
      binary: request.binary,
      ...(request.cosmology ? { cosmology: request.cosmology } : {}),
      ...(request.conventions ? { conventions: request.conventions } : {}),
    };
    setSaved(undefined);
    if (v.target === NEW) create.mutate({ name: v.new_name, description: "", records: [record] }, { onSuccess: setSaved });
    else append.mutate({ sheetId: Number(v.target), record }, { onSuccess: setSaved });
  };

  return (
    <section aria-labelledby="save-title" className="rounded border border-sea/30 bg-sea-wash/40 p-4" data-testid="save-to-sheet">
      <h3 id="save-title" className="mb-3 text-lg">
        Save this translation to a sheet
      </h3>
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
        <Field label="New sheet's name" error={fieldError("new_name")}>
          {(c) => <TextInput {...c} {...register("new_name")} />}
        </Field>
        <div className="sm:col-span-3 flex flex-wrap items-baseline gap-4">
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
      {error && Object.keys(serverFields).length === 0 && <ErrorNote error={error} title="The record was not saved." />}
    </section>
  );
}
