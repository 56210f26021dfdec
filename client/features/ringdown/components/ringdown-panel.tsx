import { MathTex } from "../../../components/ui/math-tex.tsx";
import { conditionText } from "../../../../common/symbol-text.ts";
import { useState, type FormEvent } from "react";
import { QNM_MODE_KEYS, ringdownConvertRequestSchema, type RingdownConvertRequest, type RingdownResult } from "../../../../common/ringdown.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote, Loading } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { symbolText } from "../../../../common/symbol-text.ts";
import { CautionList } from "../../translate/components/caution-list.tsx";
import { bestReference } from "../../translate/components/results-table.tsx";
import { unitText } from "../../translate/components/sci-number.tsx";
import { useRingdownConvert } from "../../consistency/api/run-consistency.ts";
import { AnswerBibliography } from "./answer-bibliography.tsx";
import { SaveToSheet } from "../../sheets/components/save-to-sheet.tsx";

const num = (s: string) => (s.trim() === "" ? undefined : Number(s));
const sig = (x: number) => Number(x.toPrecision(3)).toString();
const TONE = { valid: "ok", outside_validity: "fail", not_assessed: "caution" } as const;
const LABEL = { valid: "valid", outside_validity: "outside validity", not_assessed: "not assessed" } as const;

/** The published bound beside a ringdown limit, as on an inspiral row: the tightest comparable one, the others on hover. */
function Comparison({ r }: { r: RingdownResult }) {
  const best = bestReference(r.reference_bounds);
  if (!best) return r.status === "bounded" ? <p className="text-xs text-ink-faint">no published bound on it in the catalogue</p> : null;
  const tone = best.verdict === "tighter" ? "text-moss" : best.verdict === "weaker" ? "text-ink-soft" : "text-ink-faint";
  const others = r.reference_bounds.filter((c) => c !== best).map((c) => c.sentence);
  return (
    <p className={`text-xs ${tone}`} title={others.join("\n") || undefined} data-testid={`ringdown-comparison-${r.slug}`}>
      {best.sentence}
    </p>
  );
}

function Row({ r }: { r: RingdownResult }) {
  const name = r.coupling ? symbolText(r.coupling.symbol, r.coupling.latex) : "";
  const unit = r.coupling && r.coupling.unit !== "1" ? ` ${unitText(r.coupling.unit)}` : "";
  const limit =
    r.status !== "bounded"
      ? null
      : r.lower && r.upper
        ? `${sig(r.lower.value)} ≤ ${name} ≤ ${sig(r.upper.value)}${unit}`
        : r.upper
          ? `${name} ≤ ${sig(r.upper.value)}${unit}`
          : `${name} ≥ ${sig(r.lower!.value)}${unit}`;
  // The magnitude in the unit the literature quotes, when it differs from the signed line above (√α in km for α in km²).
  const quoted = r.limit && (r.limit.symbol !== r.coupling?.symbol || (r.lower !== null && r.upper !== null)) ? r.limit : null;
  // Each condition that does not simply hold at a limit: stretched (kept as valid) or failing.
  const flagged = [...(r.lower?.validity ?? []), ...(r.upper?.validity ?? [])].filter((c, i, all) => c.status !== "ok" && all.findIndex((d) => d.label === c.label && d.status === c.status) === i);
  return (
    <tr className="border-t border-paper-edge align-top" data-testid={`ringdown-result-${r.slug}`}>
      <th scope="row" className="text-left font-normal">
        {r.name}
      </th>
      <td>
        {limit ?? <span className="text-ink-faint">{r.reason}</span>}
        {quoted && (
          <p className="text-ink-soft" data-testid={`ringdown-quoted-${r.slug}`}>
            {symbolText(quoted.symbol, quoted.latex)} ≤ {sig(quoted.value)}
            {quoted.unit !== "1" ? ` ${unitText(quoted.unit)}` : ""}
          </p>
        )}
        <Comparison r={r} />
      </td>
      <td>
        {r.status === "bounded" && <Badge tone={TONE[r.verdict]}>{LABEL[r.verdict]}</Badge>}
        {flagged.map((c) => (
          <p key={`${c.label}-${c.status}`} className={`text-xs ${c.status === "fails" ? "text-brick" : "text-amber"}`} data-status={c.status}>
            {conditionText(c.label)}
            {c.factor === null ? "" : ` (× ${sig(c.factor)})`}
            {c.status === "stretched" ? ": stretched, kept as valid" : ""}
          </p>
        ))}
      </td>
      <td className="text-xs text-ink-soft">
        {r.mapping && (r.mapping.latex ? <MathTex tex={r.mapping.latex} label={r.mapping.expression} /> : <code>{r.mapping.expression}</code>)}
        {r.references.length > 0 && <p>sources: {r.references.map((c) => c.citation).join("; ")}</p>}
        {r.unconstrained.map((u) => (
          <p key={u.side}>
            {u.side} side: {u.reason}
          </p>
        ))}
        {r.cautions.length > 0 && <CautionList cautions={r.cautions} compact />}
      </td>
    </tr>
  );
}

/** A bound on a fractional shift of one quasinormal mode, translated through the catalogue's ringdown mappings. */
export function RingdownPanel() {
  const [f, setF] = useState({ parameter: "qnm_dfreq", mode: "220", kind: "upper", upper: "0.05", lo: "-0.05", hi: "0.08", credibility: "0.9", M_f: "67.5", chi_f: "0.68", frame: "detector", z: "0.09" });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [request, setRequest] = useState<RingdownConvertRequest | undefined>();
  const result = useRingdownConvert(request);
  const shown = { ...(result.error instanceof ApiError ? result.error.fields : {}), ...errors };
  const set = (k: keyof typeof f) => (e: { target: { value: string } }) => setF((v) => ({ ...v, [k]: e.target.value }));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const bound =
      f.kind === "upper"
        ? { parameter: f.parameter, mode: f.mode, upper: num(f.upper), credibility: num(f.credibility) }
        : { parameter: f.parameter, mode: f.mode, interval: [num(f.lo) ?? null, num(f.hi) ?? null], credibility: num(f.credibility) };
    const parsed = ringdownConvertRequestSchema.safeParse({ bound, remnant: { M_f: num(f.M_f), chi_f: num(f.chi_f), frame: f.frame, ...(num(f.z) === undefined ? {} : { z: num(f.z) }) } });
    if (!parsed.success) {
      const next: Record<string, string> = {};
      for (const issue of parsed.error.issues) next[issue.path.join(".")] ??= issue.message;
      setErrors(next);
      return;
    }
    setErrors({});
    setRequest(parsed.data);
  };

  return (
    <section className="flex flex-col gap-4 rounded border border-paper-edge p-4" aria-labelledby="ringdown-heading" data-testid="ringdown-panel">
      <h2 id="ringdown-heading" className="text-2xl">
        Ringdown: a bound on a quasinormal-mode shift
      </h2>
      <p className="max-w-3xl text-ink-soft">
        A bound on the fractional shift of one mode's frequency or damping time, measured on a remnant of known mass and spin, limits every coupling whose entry has a ringdown
        mapping for that mode.
      </p>
      <form onSubmit={submit} className="grid grid-cols-2 gap-3 sm:grid-cols-4" noValidate>
        <Field label="Shift of" error={shown["bound.parameter"]}>
          {(c) => (
            <Select {...c} value={f.parameter} onChange={set("parameter")}>
              <option value="qnm_dfreq">frequency δf/f</option>
              <option value="qnm_dtau">damping time δτ/τ</option>
            </Select>
          )}
        </Field>
        <Field label="Mode (l m n)" error={shown["bound.mode"]}>
          {(c) => (
            <Select {...c} value={f.mode} onChange={set("mode")}>
              {QNM_MODE_KEYS.map((m) => (
                <option key={m} value={m}>
                  ({m.split("").join(",")})
                </option>
              ))}
            </Select>
          )}
        </Field>
        <Field label="Bound" error={shown["bound.upper"]}>
          {(c) => (
            <Select {...c} value={f.kind} onChange={set("kind")}>
              <option value="upper">|shift| ≤ upper</option>
              <option value="interval">interval [lo, hi]</option>
            </Select>
          )}
        </Field>
        {f.kind === "upper" ? (
          <Field label="upper" error={shown["bound.upper"]}>
            {(c) => <TextInput {...c} inputMode="decimal" value={f.upper} onChange={set("upper")} />}
          </Field>
        ) : (
          <div className="grid grid-cols-2 gap-2">
            <Field label="lo" error={shown["bound.interval"]} hint="blank: unbounded">
              {(c) => <TextInput {...c} inputMode="decimal" value={f.lo} onChange={set("lo")} />}
            </Field>
            <Field label="hi">{(c) => <TextInput {...c} inputMode="decimal" value={f.hi} onChange={set("hi")} />}</Field>
          </div>
        )}
        <Field label="Credibility" error={shown["bound.credibility"]}>
          {(c) => <TextInput {...c} inputMode="decimal" value={f.credibility} onChange={set("credibility")} />}
        </Field>
        <Field label={<>Remnant M<sub>f</sub> (M☉)</>} error={shown["remnant.M_f"]}>
          {(c) => <TextInput {...c} inputMode="decimal" value={f.M_f} onChange={set("M_f")} />}
        </Field>
        <Field label={<>Remnant χ<sub>f</sub></>} error={shown["remnant.chi_f"]}>
          {(c) => <TextInput {...c} inputMode="decimal" value={f.chi_f} onChange={set("chi_f")} />}
        </Field>
        <Field label="Remnant frame" error={shown["remnant.frame"]}>
          {(c) => (
            <Select {...c} value={f.frame} onChange={set("frame")}>
              <option value="detector">detector</option>
              <option value="source">source</option>
            </Select>
          )}
        </Field>
        <Field label="Redshift z" error={shown["remnant.z"]}>
          {(c) => <TextInput {...c} inputMode="decimal" value={f.z} onChange={set("z")} />}
        </Field>
        <div className="col-span-2 flex items-end sm:col-span-4">
          <Button kind="primary" type="submit" data-testid="run-ringdown">
            Translate the ringdown bound
          </Button>
        </div>
      </form>
      {result.isFetching && <Loading what="the translation" />}
      {result.error && !(result.error instanceof ApiError && Object.keys(result.error.fields).length > 0) && <ErrorNote error={result.error} title="The translation failed." />}
      {result.data && (
        <>
          <p className="text-sm text-ink-soft" data-testid="ringdown-mode">
            Kerr ({result.data.qnm.mode.split("").join(",")}) mode at this remnant: f = {result.data.qnm.frequency_hz.toFixed(1)} Hz, τ = {(result.data.qnm.damping_time_s * 1e3).toFixed(2)} ms (
            {result.data.qnm.frame} frame; Berti, Cardoso & Will 2006 fits, about 2 % from the exact values).
          </p>
          {result.data.results.length === 0 ? (
            <p className="text-ink-faint">No catalogue entry has a ringdown mapping for this shift and mode.</p>
          ) : (
            <div className="overflow-x-auto">
              <table className="w-full text-sm">
                <thead>
                  <tr className="text-left">
                    <th scope="col">entry</th>
                    <th scope="col">limit</th>
                    <th scope="col">validity at the limit</th>
                    <th scope="col">mapping and cautions</th>
                  </tr>
                </thead>
                <tbody>
                  {result.data.results.map((r) => (
                    <Row key={`${r.slug}-${r.mapping?.kind ?? ""}`} r={r} />
                  ))}
                </tbody>
              </table>
            </div>
          )}
          <CautionList cautions={result.data.cautions} testId="ringdown-cautions" />
          <AnswerBibliography entries={result.data.bibliography} testId="ringdown-bibliography" />
          {request && <SaveToSheet what="this ringdown translation" payload={{ kind: "ringdown", request }} defaults={{ analysis_method: "ringdown: bound on a quasinormal-mode shift" }} />}
        </>
      )}
    </section>
  );
}
