import { FAMILY_LABELS, type ChecksReport, type SubmissionDetail } from "../../../../common/catalogue.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { CheckBadge, CheckList, worstOutcome } from "../../../components/ui/check-list.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { displayName, thresholdText, unitLabel } from "../../../components/ui/text-format.ts";
import { useRenderedExpression } from "../api/render-expression.ts";

type Entry = SubmissionDetail["theory"];

/** The checks that concern one part of the entry ("mappings.0" also covers "mappings.0.validity.1"). */
export function checksUnder(report: ChecksReport, path: string) {
  return report.results.filter((r) => r.path === path || r.path.startsWith(`${path}.`));
}

const targetOf = { inspiral_phase: "ppe_phase", inspiral_amplitude: "ppe_amplitude", ringdown_frequency: "ringdown_frequency", ringdown_damping: "ringdown_damping", remnant_mass: "remnant_mass", remnant_spin: "remnant_spin" } as const;

const lhsOf = { inspiral_phase: "\\beta", inspiral_amplitude: "\\alpha_{\\rm ppE}", ringdown_frequency: "\\delta\\omega/\\omega", ringdown_damping: "\\delta\\tau/\\tau", remnant_mass: "\\delta M_f/M_f", remnant_spin: "\\delta\\chi_f/\\chi_f" } as const;

/** A mapping typed without TeX, typeset by the engine's reading of it (or shown as typed if that fails). */
function EngineTex({ entry, index }: { entry: Entry; index: number }) {
  const m = entry.mappings[index];
  const rendered = useRenderedExpression({
    expression: m?.expression ?? "",
    target: targetOf[m?.kind ?? "inspiral_phase"],
    couplings: entry.couplings.map((c) => ({ symbol: c.symbol, dimension: c.dimension })),
    definitions: (entry.definitions ?? []).map((d) => ({ symbol: d.symbol, expression: d.expression })),
  });
  if (!rendered.data?.latex) return null;
  return <MathTex display tex={`${lhsOf[m?.kind ?? "inspiral_phase"]} = ${rendered.data.latex}`} />;
}

function groupByPath(results: ChecksReport["results"]): [string, ChecksReport["results"]][] {
  const groups = new Map<string, ChecksReport["results"]>();
  for (const r of results) groups.set(r.path, [...(groups.get(r.path) ?? []), r]);
  return [...groups.entries()];
}

/** "mappings.0" → "the expression"; "mappings.0.validity.1" → "validity condition 2". */
function pathLabel(path: string): string {
  const v = /\.validity\.(\d+)$/.exec(path);
  if (v) return `Validity condition ${Number(v[1]) + 1}`;
  return /^mappings\.\d+$/.test(path) ? "The expression" : path;
}

function names(authors: string | string[]): string {
  return (Array.isArray(authors) ? authors : authors.split(/\s+and\s+/)).map(displayName).join(", ");
}

/** The submitted entry as a reviewer reads it: couplings, definitions, each mapping with its checks. */
export function EntryPreview({ entry, checks }: { entry: Entry; checks: ChecksReport }) {
  return (
    <div className="flex flex-col gap-5">
      <div>
        <p className="text-sm text-ink-soft">
          {FAMILY_LABELS[entry.family]} · <span className="font-mono">{entry.slug}</span>
        </p>
        <p className="mt-1 max-w-prose">{entry.summary}</p>
        {entry.action_latex && (
          <div className="mt-2 overflow-x-auto rounded border border-paper-edge bg-paper px-3 py-2 text-[0.8rem]">
            <MathTex display tex={entry.action_latex} />
          </div>
        )}
      </div>
      <div>
        <h3 className="font-semibold mb-1">Couplings</h3>
        <ul className="flex flex-col gap-1">
          {entry.couplings.map((c, i) => (
            <li key={i} className="flex flex-wrap items-baseline gap-3">
              <MathTex tex={c.latex || c.symbol} />
              <span className="font-mono text-xs">{c.symbol}</span>
              <span className="text-sm text-ink-soft tabular-nums">
                L<sup>{c.dimension}</sup> (G = c = 1), unit {unitLabel(c.unit)}
              </span>
              {c.description && <span className="text-sm text-ink-soft">{c.description}</span>}
            </li>
          ))}
        </ul>
        {(entry.definitions ?? []).length > 0 && (
          <ul className="mt-2 flex flex-col gap-1 font-mono text-sm">
            {(entry.definitions ?? []).map((d, i) => (
              <li key={i}>
                {d.symbol} = {d.expression}
              </li>
            ))}
          </ul>
        )}
      </div>
      <div className="flex flex-col gap-3">
        <h3 className="font-semibold">Mappings</h3>
        {entry.mappings.map((m, i) => {
          const own = checksUnder(checks, `mappings.${i}`);
          return (
            <article key={i} className="rounded border border-paper-edge bg-white/40 p-3" data-testid={`review-mapping-${i}`}>
              <header className="flex flex-wrap items-center gap-3">
                <span className="font-semibold">Mapping {i + 1}</span>
                <span className="text-sm text-ink-soft">{m.kind.replace(/_/g, " ")}</span>
                {m.b !== undefined && <MathTex tex={`b = ${m.b}`} />}
                {m.pn_order !== undefined && <span className="text-sm tabular-nums">{m.pn_order < 0 ? `−${-m.pn_order}` : m.pn_order}PN</span>}
                {m.source_status === "memory" && <Badge tone="caution">source to be confirmed</Badge>}
                <span className="ml-auto">
                  <CheckBadge outcome={worstOutcome(own)} />
                </span>
              </header>
              <div className="my-2 overflow-x-auto">{m.latex ? <MathTex display tex={m.latex} /> : <EngineTex entry={entry} index={i} />}</div>
              <p className="font-mono text-xs text-ink-soft break-all">{m.expression}</p>
              {(m.validity ?? []).length > 0 && (
                <ul className="mt-2 text-sm text-ink-soft">
                  {(m.validity ?? []).map((v, j) => (
                    <li key={j}>
                      valid while <span className="font-mono">{v.expression}</span> &lt; <span className="tabular-nums">{thresholdText(v.max)}</span> ({v.label})
                    </li>
                  ))}
                </ul>
              )}
              <div className="mt-2 flex flex-col gap-2">
                {groupByPath(own).map(([path, list]) => (
                  <div key={path}>
                    <p className="text-xs font-semibold text-ink-soft">{pathLabel(path)}</p>
                    <CheckList checks={list} />
                  </div>
                ))}
              </div>
            </article>
          );
        })}
      </div>
      <div>
        <h3 className="font-semibold mb-1">References</h3>
        <ol className="list-decimal pl-5 text-sm">
          {entry.references.map((r, i) => (
            <li key={i}>
              {names(r.authors)} ({r.year}). <i>{r.title}</i>
              {r.arxiv ? `, arXiv:${r.arxiv}` : ""}
              {r.doi ? `, doi:${r.doi}` : ""}
              {r.key && <span className="ml-2 font-mono text-xs text-ink-faint">[{r.key}]</span>}
            </li>
          ))}
        </ol>
      </div>
    </div>
  );
}
