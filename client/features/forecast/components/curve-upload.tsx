import { useState, type FormEvent } from "react";
import { CURVE_CONVENTIONS, type CurveInfoDto } from "../../../../common/forecasts.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useDeleteCurve, useUploadCurve } from "../api/forecasts.ts";

const CONVENTION_TEXT: Record<(typeof CURVE_CONVENTIONS)[number], string> = {
  l_shaped: "one L-shaped interferometer (bare noise)",
  triangle: "one 60° interferometer of a triangle of three",
  two_channel_triangle: "one triangle read as two 60° channels",
  response_averaged: "sky-averaged response already in the curve (LISA-style)",
};

/** Upload a tabulated noise curve (e.g. a Cosmic Explorer table) and manage your uploads. */
export function CurveUpload({ curves }: { curves: CurveInfoDto[] }) {
  const upload = useUploadCurve();
  const remove = useDeleteCurve();
  const [name, setName] = useState("");
  const [kind, setKind] = useState<"asd" | "psd">("asd");
  const [convention, setConvention] = useState<(typeof CURVE_CONVENTIONS)[number]>("l_shaped");
  const [space, setSpace] = useState(false);
  const [file, setFile] = useState<File | null>(null);
  const fields = upload.error instanceof ApiError ? upload.error.fields : {};
  const mine = curves.filter((c) => c.custom);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!file) return;
    upload.mutate({ file, name: name.trim() || file.name.replace(/\.[^.]*$/, "").slice(0, 80) || "uploaded curve", kind, convention, space }, { onSuccess: () => setFile(null) });
  };

  return (
    <details className="rounded border border-paper-edge p-3" data-testid="curve-upload">
      <summary className="cursor-pointer font-semibold">Your noise curves ({mine.length})</summary>
      <form onSubmit={submit} className="mt-3 grid grid-cols-2 items-end gap-3 md:grid-cols-6">
        <Field label="Name" error={fields.name}>{(c) => <TextInput {...c} value={name} onChange={(e) => setName(e.target.value)} maxLength={80} />}</Field>
        <Field label="Second column" error={fields.kind}>
          {(c) => (
            <Select {...c} value={kind} onChange={(e) => setKind(e.target.value === "psd" ? "psd" : "asd")}>
              <option value="asd">ASD [1/√Hz]</option>
              <option value="psd">PSD [1/Hz]</option>
            </Select>
          )}
        </Field>
        <Field label="Convention" error={fields.convention} className="md:col-span-2">
          {(c) => (
            <Select {...c} value={convention} onChange={(e) => setConvention(CURVE_CONVENTIONS.find((x) => x === e.target.value) ?? "l_shaped")}>
              {CURVE_CONVENTIONS.map((x) => (
                <option key={x} value={x}>
                  {CONVENTION_TEXT[x]}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={space} onChange={(e) => setSpace(e.target.checked)} /> in space (observing window)
        </label>
        <Field label="Table (frequency, value)" error={fields.file} hint="text or CSV: two columns; # comments and a header line are fine">
          {(c) => <input {...c} type="file" accept=".txt,.csv,.dat,text/plain,text/csv" onChange={(e) => setFile(e.target.files?.[0] ?? null)} className="text-sm" />}
        </Field>
        <div>
          <Button type="submit" busy={upload.isPending} disabled={!file}>
            Upload
          </Button>
        </div>
      </form>
      {upload.error && !fields.file && <ErrorNote error={upload.error} title="The curve was not stored." />}
      {mine.length > 0 && (
        <ul className="mt-3 flex flex-col gap-1 text-sm">
          {mine.map((c) => (
            <li key={c.id} className="flex items-center gap-3">
              <span>
                {c.name} <span className="text-ink-faint">({c.id}, {c.points} rows, {c.f_min}–{c.f_max} Hz, {c.convention})</span>
              </span>
              <Button kind="quiet" onClick={() => remove.mutate(Number(c.id.split(":")[1]))} aria-label={`delete ${c.name}`}>
                Delete
              </Button>
            </li>
          ))}
        </ul>
      )}
    </details>
  );
}
