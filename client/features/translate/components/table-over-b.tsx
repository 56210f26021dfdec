import { useState, type ChangeEvent } from "react";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { convertTableRequestSchema, type ConvertRequest, type ConvertTableRequest, type ConvertTableResponse } from "../../../../common/convert.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { Field, TextArea } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { parseBoundsCsv } from "../lib/parse-bounds-csv.ts";
import { CautionList } from "./caution-list.tsx";
import { SciNumber, unitText } from "./sci-number.tsx";

export const EXAMPLE_CSV = ["b,upper,label", "-7,1e-3,dipole", "-3,2e-2,1PN", "-1,0.3,2PN", "-13,1e-6,-4PN"].join("\n");

interface Props {
  /** The binary, cosmology and credibility come from the form's last translated request. */
  base: ConvertRequest | undefined;
  onRequest: (request: ConvertTableRequest) => void;
  data: ConvertTableResponse | undefined;
  error: unknown;
  busy: boolean;
}

/** Row i of the table sits on CSV line i + 2 (line 1 is the header). */
function describeIssues(fields: Record<string, string>): string[] {
  return Object.entries(fields).map(([path, message]) => {
    const m = /^rows\.(\d+)\.?(.*)$/.exec(path);
    return m ? `line ${Number(m[1]) + 2}${m[2] ? `, ${m[2]}` : ""}: ${message}` : `${path}: ${message}`;
  });
}

export function TableOverB({ base, onRequest, data, error, busy }: Props) {
  const [csv, setCsv] = useState(EXAMPLE_CSV);
  const [problems, setProblems] = useState<string[]>([]);

  const upload = async (e: ChangeEvent<HTMLInputElement>) => {
    const file = e.target.files?.[0];
    if (file) setCsv(await file.text());
  };

  const run = async () => {
    if (!base) return;
    const parsed = await parseBoundsCsv(csv);
    if (parsed.problems.length > 0) {
      setProblems(parsed.problems);
      return;
    }
    const candidate = {
      rows: parsed.rows,
      binary: base.binary,
      cosmology: base.cosmology,
      credibility: base.bound.credibility,
      sign_convention: base.bound.parameter === "ppe_beta" ? base.bound.sign_convention : "plus",
      includes_spin: base.bound.parameter === "gimr_dphi" ? base.bound.includes_spin : false,
    };
    const checked = convertTableRequestSchema.safeParse(candidate);
    if (!checked.success) {
      const fields: Record<string, string> = {};
      for (const issue of checked.error.issues) fields[issue.path.join(".")] ??= issue.message;
      setProblems(describeIssues(fields));
      return;
    }
    setProblems([]);
    onRequest(checked.data);
  };

  const serverProblems = error instanceof ApiError && Object.keys(error.fields).length > 0 ? describeIssues(error.fields) : [];

  return (
    <section aria-labelledby="table-over-b-title" className="flex flex-col gap-4">
      <h2 id="table-over-b-title" className="text-2xl">
        A table over b
      </h2>
      <p className="text-sm text-ink-soft">
        Paste or upload bounds, one per line, with the columns <code>b</code> (or <code>k</code>), <code>upper</code> (or <code>lo</code> and <code>hi</code> for a signed interval, one left empty for a one-sided bound) and optionally <code>label</code>. Each row is
        translated for the binary, cosmology and credibility of the form above.
      </p>
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <Field label="Bounds (CSV)" error={problems[0]}>
          {(c) => <TextArea {...c} rows={6} value={csv} onChange={(e) => setCsv(e.target.value)} data-testid="csv-input" />}
        </Field>
        <div className="flex flex-col gap-3">
          <label className="text-sm font-semibold">
            or upload a .csv file
            <input type="file" accept=".csv,text/csv" className="mt-1 block text-sm" onChange={(e) => void upload(e)} data-testid="csv-file" />
          </label>
          <Button kind="primary" onClick={() => void run()} disabled={!base} busy={busy} data-testid="run-table">
            Translate every row
          </Button>
          {!base && <p className="text-xs text-ink-faint">Translate one bound first: the table uses its binary.</p>}
        </div>
      </div>
      {[...problems.slice(1), ...serverProblems].length > 0 && (
        <ul role="alert" className="text-sm text-brick">
          {[...problems.slice(1), ...serverProblems].map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      {error !== null && error !== undefined && serverProblems.length === 0 && <ErrorNote error={error} title="The table could not be translated." />}
      {data && <TableResults data={data} />}
    </section>
  );
}

function TableResults({ data }: { data: ConvertTableResponse }) {
  return (
    <div className="overflow-x-auto rounded border border-paper-edge bg-white/40">
      <table className="w-full border-collapse text-[0.95rem]" data-testid="table-results">
        <caption className="sr-only">Every matching theory for each row</caption>
        <thead className="bg-paper-deep text-left text-sm">
          <tr>
            {["Row", "Bound", "Theory", "Limit", "Validity", "Cautions"].map((h) => (
              <th key={h} scope="col" className="border-b border-paper-edge px-3 py-2 font-semibold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {data.rows.flatMap((row) => {
            const head = (
              <>
                <td className="px-3 py-2 text-sm">{row.label ?? `#${row.index + 1}`}</td>
                <td className="px-3 py-2 text-sm whitespace-nowrap">
                  <BoundText symbol={row.input.k !== null ? `δφ_${row.input.k}` : "β"} upper={row.input.upper} interval={row.input.interval} />
                  {row.b !== null && <span className="text-ink-faint"> at b = {row.b}</span>}
                </td>
              </>
            );
            if (row.results.length === 0) {
              return [
                <tr key={`${row.index}-none`} className="border-b border-paper-edge/70 align-top" data-testid={`table-row-${row.index}`}>
                  {head}
                  <td colSpan={4} className="px-3 py-2 text-sm text-ink-soft">
                    no catalogued theory is constrained here
                    {[...row.cautions.map((c) => conditionText(c.message)), ...row.not_applicable.filter((n) => !["different_b", "degenerate_b", "no_ppe_equivalent"].includes(n.code)).map((n) => `${n.theory_name}: ${n.reason}`)].map((m) => (
                      <span key={m} className="block text-xs">
                        {m}
                      </span>
                    ))}
                  </td>
                </tr>,
              ];
            }
            return row.results.map((r, i) => (
              <tr key={`${row.index}-${r.theory}`} className="border-b border-paper-edge/70 align-top" data-testid={`table-row-${row.index}`}>
                {i === 0 ? head : <td colSpan={2} />}
                <td className="px-3 py-2">{r.theory_name}</td>
                <td className="px-3 py-2 whitespace-nowrap">
                  {symbolText(r.coupling.symbol, r.coupling.latex)} {r.coupling.side === "upper" ? "≤" : "≥"} <SciNumber value={r.coupling.value} className="font-semibold" /> {unitText(r.coupling.unit)}
                </td>
                <td className="px-3 py-2">
                  {!r.valid ? <Badge tone="fail">not valid</Badge> : r.validity.some((v) => !v.ok) ? <Badge tone="caution">valid, with caution</Badge> : <Badge tone="ok">valid</Badge>}
                </td>
                <td className="px-3 py-2">
                  <CautionList cautions={r.cautions.filter((c) => c.code === "validity" || c.code === "one_signed")} compact />
                </td>
              </tr>
            ));
          })}
        </tbody>
      </table>
    </div>
  );
}

/** |x| <= U, x in [lo, hi], or one side of it. */
function BoundText({ symbol, upper, interval }: { symbol: string; upper: number | null; interval: readonly [number | null, number | null] | null }) {
  if (upper !== null) {
    return (
      <>
        |{symbol}| ≤ <SciNumber value={upper} />
      </>
    );
  }
  const [lo, hi] = interval ?? [null, null];
  if (lo !== null && hi !== null) {
    return (
      <>
        {symbol} ∈ [<SciNumber value={lo} />, <SciNumber value={hi} />]
      </>
    );
  }
  return lo !== null ? (
    <>
      {symbol} ≥ <SciNumber value={lo} />
    </>
  ) : (
    <>
      {symbol} ≤ <SciNumber value={hi ?? Number.NaN} />
    </>
  );
}
