import { catalogueVersionText } from "../../../../common/catalogue-version.ts";
import { formatDateTime } from "../../../../common/dates.ts";
import { COLUMN_ROLES, type ColumnRoleName } from "../../../../common/jobs.ts";
import type { ConsistencyRecord, SamplesJobRecord, StackRecord } from "../../../../common/sheets.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { num, unit } from "./translation-record.tsx";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";

/** Samples, stacking and consistency records: the result as the job (or the test) computed it, with its provenance. */

type Coupling = SamplesJobRecord["result"]["coupling"];
type Verdict = SamplesJobRecord["result"]["verdict"];

function couplingText(c: Coupling) {
  return (
    <>
      <MathTex tex={c.latex} label={symbolText(c.symbol, c.latex)} />{" "}
      {c.signed_interval ? `∈ [${num(c.signed_interval[0])}, ${num(c.signed_interval[1])}]` : `${c.side === "lower" ? "≥" : "≤"} ${num(c.value ?? Number.NaN)}`} {unit(c.unit)}
    </>
  );
}

/** 0.0123 -> "1.2%", 1 -> "100%". */
const percent = (x: number) => `${x === 0 || x >= 0.1 ? Math.round(x * 1000) / 10 : Number((x * 100).toPrecision(2))}%`;

function VerdictBadge({ v, fraction }: { v: Verdict; fraction: number }) {
  const pct = `${percent(fraction)} of the posterior's binaries outside`;
  if (v === "valid") return <Badge tone="ok" title={pct}>valid</Badge>;
  if (v === "outside_validity") return <Badge tone="fail" title={pct}>not valid</Badge>;
  return <Badge tone="neutral">validity not assessed</Badge>;
}

function priorText(p: { kind: string; range: [number, number] | null }): string {
  const range = p.range ? ` over [${num(p.range[0])}, ${num(p.range[1])}]` : "";
  return p.kind === "as_translated" ? "as translated (the analysis prior)" : p.kind === "log_uniform" ? `log-uniform in the coupling${range}` : `uniform in the coupling${range}`;
}

function bytes(n: number): string {
  return n < 1024 ? `${n} B` : n < 1024 ** 2 ? `${(n / 1024).toPrecision(3)} kB` : n < 1024 ** 3 ? `${(n / 1024 ** 2).toPrecision(3)} MB` : `${(n / 1024 ** 3).toPrecision(3)} GB`;
}

function Cautions({ items }: { items: string[] }) {
  if (items.length === 0) return null;
  return (
    <ul className="mt-2 list-disc pl-5 text-xs text-amber">
      {items.map((c, i) => (
        <li key={i}>{conditionText(c)}</li>
      ))}
    </ul>
  );
}

function Provenance({ children }: { children: React.ReactNode }) {
  return <dl className="mt-2 grid gap-x-4 gap-y-1 text-xs text-ink-soft sm:grid-cols-[auto_1fr]">{children}</dl>;
}

function Item({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <>
      <dt className="font-semibold">{term}</dt>
      <dd className="break-words">{children}</dd>
    </>
  );
}

export function SamplesRecordBody({ r }: { r: SamplesJobRecord }) {
  const x = r.result;
  const deviation = r.request.parameter === "ppe_beta" ? `β at b = ${x.b}` : `δφ_${r.request.k}`;
  const lowEss = x.effective_sample_size < 1000;
  return (
    <>
      <p className="text-sm text-ink-soft">
        Posterior samples of {deviation}, {Math.round(x.credibility * 1000) / 10}% credibility · {x.theory_name}
        {r.analysis_method && <> · {r.analysis_method}</>}
      </p>
      <p className="mt-2 flex flex-wrap items-baseline gap-3 text-lg tabular-nums" data-testid="record-result">
        <span>{couplingText(x.coupling)}</span>
        <VerdictBadge v={x.verdict} fraction={x.fraction_outside} />
      </p>
      <p className={`text-sm ${lowEss ? "text-amber" : "text-ink-soft"}`}>
        Effective sample size {Math.round(x.effective_sample_size).toLocaleString("en-US")} of {x.samples.used.toLocaleString("en-US")} used ({x.samples.read.toLocaleString("en-US")} read, {x.samples.dropped.toLocaleString("en-US")} dropped)
        {lowEss ? ": small, so the bound is noisy." : "."} {percent(x.fraction_outside)} of the binaries are outside validity at the bound.
      </p>
      <Cautions items={x.cautions.map((c) => c.message)} />
      <Provenance>
        <Item term="File">
          {r.file.name} ({bytes(r.file.bytes)}, {r.file.format}){r.file.sha256 && <span className="block font-mono text-[0.7rem]">sha256 {r.file.sha256}</span>}
        </Item>
        <Item term="Columns">
          {Object.entries(x.columns)
            .sort(([a], [b]) => COLUMN_ROLES.indexOf(a as ColumnRoleName) - COLUMN_ROLES.indexOf(b as ColumnRoleName))
            .map(([role, name]) => `${role} ← ${name}`)
            .join(", ")}
          {x.table ? ` (table ${x.table})` : ""}, {x.frame} frame
        </Item>
        <Item term="Prior">
          {priorText(x.prior)}; analysis prior uniform in {x.analysis_prior.parameter === "ppe_beta" ? "β" : "δφ"} over [{num(x.analysis_prior.range[0])}, {num(x.analysis_prior.range[1])}]
        </Item>
        <Item term="Job">
          {r.job.id}, finished {r.job.finished_at ? formatDateTime(r.job.finished_at) : "?"}; catalogue of{" "}
          <span title={`catalogue version ${x.catalogue_revision}`} className="underline decoration-dotted">
            {catalogueVersionText(x.catalogue_revision)}
          </span>
        </Item>
      </Provenance>
    </>
  );
}

export function StackRecordBody({ r }: { r: StackRecord }) {
  const x = r.result;
  return (
    <>
      <p className="text-sm text-ink-soft">
        {x.events.filter((e) => e.used).length} of {x.events.length} events stacked, {Math.round(x.credibility * 1000) / 10}% credibility · {x.theory_name}
        {r.analysis_method && <> · {r.analysis_method}</>}
      </p>
      <p className="mt-2 flex flex-wrap items-baseline gap-3 text-lg tabular-nums" data-testid="record-result">
        <span>{couplingText(x.coupling)}</span>
        <VerdictBadge v={x.verdict} fraction={x.fraction_outside} />
      </p>
      <ul className="mt-1 text-sm">
        {x.events.map((e, i) => (
          <li key={i} className={e.used ? "" : "text-ink-faint"}>
            {e.label} ({e.kind === "summary" ? "quick estimate from a summary" : "samples"}){e.interval ? <>: interval [{num(e.interval[0])}, {num(e.interval[1])}]</> : e.bound !== null && <>: bound {num(e.bound)}</>}
            {e.verdict && <>, {e.verdict === "valid" ? "valid" : e.verdict === "outside_validity" ? "not valid" : "not assessed"}</>}
            {!e.used && <> — not used: {e.reason ?? "excluded"}</>}
            {r.event_files[i]?.file && <span className="text-xs text-ink-soft"> · {r.event_files[i]!.file!.name}</span>}
          </li>
        ))}
      </ul>
      <Cautions items={x.cautions.map((c) => c.message)} />
      <Provenance>
        <Item term="Prior">{priorText(x.prior)}</Item>
        <Item term="Job">
          {r.job.id}, finished {r.job.finished_at ? formatDateTime(r.job.finished_at) : "?"}
        </Item>
      </Provenance>
    </>
  );
}

export function ConsistencyRecordBody({ r }: { r: ConsistencyRecord }) {
  const x = r.result;
  const [dm, dchi] = x.deviation.mean;
  const [[cmm], [, ccc]] = x.deviation.covariance;
  const s = r.summaries;
  return (
    <>
      <p className="text-sm text-ink-soft">
        IMR consistency from {r.method === "gaussian" ? "two Gaussian remnant estimates" : "posterior samples"}
        {r.analysis_method && <> · {r.analysis_method}</>}
      </p>
      <p className="mt-2 flex flex-wrap items-baseline gap-4 text-lg tabular-nums" data-testid="record-result">
        <span>
          ΔM<sub>f</sub>/M̄<sub>f</sub> = {num(dm)} ± {num(Math.sqrt(cmm))}
        </span>
        <span>
          Δχ<sub>f</sub>/χ̄<sub>f</sub> = {num(dchi)} ± {num(Math.sqrt(ccc))}
        </span>
        <span>GR quantile {percent(x.gr_quantile)}</span>
      </p>
      <p className="text-sm text-ink-soft">
        Contours at {x.contours.map((c) => `${Math.round(c.level * 100)}%`).join(", ")}
        {x.split_frequency_hz !== undefined && (
          <>
            ; split frequency {num(x.split_frequency_hz)} Hz{x.split && <> (from the {x.split.from === "full_signal" ? "full-signal" : "inspiral"} estimate's remnant)</>}
          </>
        )}
        .
      </p>
      <Cautions items={x.cautions} />
      <Provenance>
        {s && (
          <>
            <Item term="Inspiral">
              M<sub>f</sub> = {s.inspiral.M_f} ± {s.inspiral.sigma_M_f} M☉, χ<sub>f</sub> = {s.inspiral.chi_f} ± {s.inspiral.sigma_chi_f}
              {s.inspiral.rho !== undefined && <>, ρ = {s.inspiral.rho}</>}
            </Item>
            <Item term="Merger-ringdown">
              M<sub>f</sub> = {s.merger_ringdown.M_f} ± {s.merger_ringdown.sigma_M_f} M☉, χ<sub>f</sub> = {s.merger_ringdown.chi_f} ± {s.merger_ringdown.sigma_chi_f}
              {s.merger_ringdown.rho !== undefined && <>, ρ = {s.merger_ringdown.rho}</>}
            </Item>
            {s.full_signal && (
              <Item term="Full signal">
                M<sub>f</sub> = {s.full_signal.M_f} M☉, χ<sub>f</sub> = {s.full_signal.chi_f}
              </Item>
            )}
            <Item term="Frame">
              {s.frame}
              {s.z !== undefined && <>, z = {s.z}</>}
            </Item>
          </>
        )}
        {r.job && (
          <>
            <Item term="Files">{r.job.files.flatMap((f) => (f.name ? [`${f.role.replace("_", "-")}: ${f.name}${f.bytes !== null ? ` (${bytes(f.bytes)})` : ""}`] : [])).join("; ") || "not kept by the job"}</Item>
            <Item term="Job">
              {r.job.id}, {r.job.request.frame} frame{r.job.request.z !== undefined && <>, z = {r.job.request.z}</>}, finished {r.job.finished_at ? formatDateTime(r.job.finished_at) : "?"}
            </Item>
          </>
        )}
      </Provenance>
    </>
  );
}
