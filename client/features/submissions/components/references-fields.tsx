import { useId, useState } from "react";
import { useFieldArray, useFormContext } from "react-hook-form";
import type { ParsedReference } from "../../../../common/catalogue.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Empty } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useParseBibtex } from "../api/parse-bibtex.ts";
import { FormField } from "./form-field.tsx";
import { optionalNumber, optionalString, type ReferenceFormInput, type SubmissionFormInput } from "./form-values.ts";
import { useFieldError } from "./use-field-error.ts";

function fromParsed(p: ParsedReference): ReferenceFormInput {
  const ref: ReferenceFormInput = { authors: p.authors.join(" and "), title: p.title, year: p.year };
  if (p.key) ref.key = p.key;
  if (p.arxiv) ref.arxiv = p.arxiv;
  if (p.doi) ref.doi = p.doi;
  if (p.journal) ref.journal = p.journal;
  if (p.volume) ref.volume = p.volume;
  if (p.pages) ref.pages = p.pages;
  if (p.locator) ref.locator = p.locator;
  return ref;
}

/** Paste one BibTeX entry; the server reads it and the reference is appended to the list below. */
function BibtexPaste({ onParsed }: { onParsed: (r: ReferenceFormInput) => void }) {
  const id = useId();
  const [text, setText] = useState("");
  const parse = useParseBibtex();
  const err = parse.error;
  const message = err instanceof ApiError ? (Object.entries(err.fields).map(([f, m]) => `${f}: ${m}`).join("; ") || err.message) : err?.message;
  return (
    <div className="rounded border border-dashed border-paper-edge p-3">
      <label htmlFor={`${id}-bib`} className="text-sm font-semibold">
        Paste a BibTeX entry
      </label>
      <textarea
        id={`${id}-bib`}
        value={text}
        onChange={(e) => setText(e.target.value)}
        rows={4}
        spellCheck={false}
        aria-invalid={Boolean(err)}
        aria-describedby={err ? `${id}-bib-error` : undefined}
        placeholder={"@article{key,\n  author = {...},\n  title = {...},\n  year = {2012}\n}"}
        className="mt-1 w-full rounded border border-paper-edge bg-white/70 px-2 py-1.5 font-mono text-xs aria-[invalid=true]:border-brick"
      />
      {err && (
        <p id={`${id}-bib-error`} role="alert" className="text-sm text-brick">
          {message}
        </p>
      )}
      <Button
        className="mt-2"
        disabled={!text.trim()}
        busy={parse.isPending}
        onClick={() =>
          parse.mutate(text, {
            onSuccess: (ref) => {
              onParsed(fromParsed(ref));
              setText("");
            },
          })
        }
      >
        Add from BibTeX
      </Button>
    </div>
  );
}

export function ReferencesFields() {
  const { control } = useFormContext<SubmissionFormInput>();
  const { fields, append, remove } = useFieldArray({ control, name: "theory.references" });
  const listError = useFieldError("theory.references");
  return (
    <div className="flex flex-col gap-3">
      {listError && (
        <p role="alert" className="text-sm text-brick">
          {listError}
        </p>
      )}
      {fields.length === 0 && <Empty>No references yet: paste a BibTeX entry or add one by hand.</Empty>}
      {fields.map((f, i) => (
        <fieldset key={f.id} className="rounded border border-paper-edge bg-white/40 p-3" data-testid={`reference-fields-${i}`}>
          <legend className="px-1 text-sm font-semibold">Reference {i + 1}</legend>
          <div className="grid gap-3 sm:grid-cols-6">
            <FormField name={`theory.references.${i}.key`} label="Citation key" className="sm:col-span-2" options={{ setValueAs: optionalString }} placeholder="yagi2012" />
            <FormField name={`theory.references.${i}.arxiv`} label="arXiv id" className="sm:col-span-2" options={{ setValueAs: optionalString }} placeholder="2104.11189" />
            <FormField name={`theory.references.${i}.doi`} label="DOI" className="sm:col-span-2" options={{ setValueAs: optionalString }} placeholder="10.1103/PhysRevD.85.064022" />
            <FormField name={`theory.references.${i}.authors`} label="Authors" className="sm:col-span-4" hint="separated by “and”" />
            <FormField name={`theory.references.${i}.year`} label="Year" inputMode="numeric" options={{ setValueAs: optionalNumber }} />
            <div />
            <FormField name={`theory.references.${i}.title`} label="Title" className="sm:col-span-6" />
            <FormField name={`theory.references.${i}.journal`} label="Journal" className="sm:col-span-3" options={{ setValueAs: optionalString }} />
            <FormField name={`theory.references.${i}.locator`} label="Equation or table used" className="sm:col-span-2" options={{ setValueAs: optionalString }} />
            <div className="flex items-end">
              <Button kind="danger" onClick={() => remove(i)} aria-label={`Remove reference ${i + 1}`}>
                Remove
              </Button>
            </div>
          </div>
        </fieldset>
      ))}
      <div className="flex flex-wrap items-start gap-4">
        <Button onClick={() => append({ authors: "", title: "", year: new Date().getFullYear() })}>Add a reference by hand</Button>
      </div>
      <BibtexPaste onParsed={(r) => append(r)} />
    </div>
  );
}
