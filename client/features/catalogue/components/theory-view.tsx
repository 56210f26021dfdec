import type { ReactNode } from "react";
import { conditionText } from "../../../../common/symbol-text.ts";
import { Link } from "react-router-dom";
import { FAMILY_LABELS, type TheoryDetail } from "../../../../common/catalogue.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { Caution } from "../../../components/ui/states.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { paths } from "../../../lib/paths.ts";
import { CouplingsPanel } from "./couplings-panel.tsx";
import { MappingsList } from "./mappings-list.tsx";
import { ReferenceBounds } from "./reference-bounds.tsx";
import { ReferencesList } from "./references-list.tsx";
import { RetiredBadge, RetiredNote } from "./retirement.tsx";
import { RevisionHistory } from "./revision-history.tsx";
import { equationTex, shortDate, symbolTex } from "./format.ts";

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="mt-10">
      <h2 id={id} className="text-2xl mb-3 border-b border-paper-edge pb-1">
        {title}
      </h2>
      {children}
    </section>
  );
}

interface Props {
  theory: TheoryDetail;
  /** Editors' tools shown at the end of the entry (retire and restore). */
  editorTools?: ReactNode;
  /** Shown beside the title when the reader may propose a change (a link to the form). */
  proposeChange?: ReactNode;
}

/** The published entry, top to bottom in the order a reader checks it: what, how it maps, from where. */
export function TheoryView({ theory, proposeChange, editorTools }: Props) {
  const t = theory;
  return (
    <article>
      <nav aria-label="Breadcrumb" className="text-sm mb-2">
        <Link to={paths.catalogue()}>Catalogue</Link> <span className="text-ink-faint">/</span> <span className="text-ink-soft">{t.slug}</span>
      </nav>
      <header className="flex flex-wrap items-start gap-4">
        <div className="grow">
          <h1 className="text-3xl leading-tight">{t.name}</h1>
          <p className="mt-1 flex flex-wrap items-center gap-3 text-sm text-ink-soft">
            <span>{FAMILY_LABELS[t.family]}</span>
            {t.kind === "parameterized_spacetime" && <Badge tone="info">parameterized spacetime</Badge>}
            <span className="tabular-nums" data-testid="theory-revision">
              revision {t.revision.number}, published {shortDate(t.revision.published_at)}
            </span>
            {t.source_to_be_confirmed && <Badge tone="caution">source to be confirmed</Badge>}
            {t.retired && <RetiredBadge retired={t.retired} />}
          </p>
        </div>
        {proposeChange}
      </header>
      {t.retired && (
        <div className="mt-4 max-w-prose rounded border border-brick/40 bg-brick-wash px-4 py-3">
          <RetiredNote retired={t.retired} what="This entry" />
        </div>
      )}
      <p className="mt-4 max-w-prose text-lg leading-relaxed">{conditionText(t.summary)}</p>
      {t.source_to_be_confirmed && (
        <div className="mt-4 max-w-prose">
          <Caution title="Parts of this entry await confirmation">
            At least one formula or value here was written from memory rather than read in the cited paper. It is marked
            “source to be confirmed” below; check it against the source before quoting a bound that rests on it.
          </Caution>
        </div>
      )}
      {(t.action_latex || t.metric_latex) && (
        <Section id="action" title={t.action_latex ? "Action" : "Metric"}>
          <div className="overflow-x-auto rounded border border-paper-edge bg-white/40 px-4 py-3">
            <MathTex display tex={(t.action_latex ?? t.metric_latex) as string} />
          </div>
        </Section>
      )}
      {t.assumptions.length > 0 && (
        <Section id="assumptions" title="Assumptions">
          <ul className="list-disc pl-6 max-w-prose">
            {t.assumptions.map((a, i) => (
              <li key={i}>{conditionText(a)}</li>
            ))}
          </ul>
        </Section>
      )}
      <Section id="couplings" title="Couplings">
        <CouplingsPanel couplings={t.couplings} />
        {t.definitions.length > 0 && (
          <div className="mt-4">
            <h3 className="text-lg mb-2">Definitions</h3>
            <ul className="flex flex-col gap-1">
              {t.definitions.map((d) => (
                <li key={d.symbol} className="flex flex-wrap items-baseline gap-3">
                  <MathTex tex={`\\displaystyle ${equationTex(symbolTex(d.symbol), d.latex)}`} />
                  {d.description && <span className="text-sm text-ink-soft">{conditionText(d.description)}</span>}
                </li>
              ))}
            </ul>
          </div>
        )}
      </Section>
      <Section id="mappings" title="Mappings onto deviation parameters">
        <p className="mb-3 max-w-prose text-sm text-ink-soft">
          Leading-order expressions in the small-coupling expansion: each holds only while its validity conditions do. Badges show the
          engine's checks (symbols, dimensions, GR limit, PN order) as stored with this revision.
        </p>
        <MappingsList mappings={t.mappings} couplings={t.couplings} />
      </Section>
      {t.reference_bounds.length > 0 && (
        <Section id="bounds" title="Published bounds">
          <ReferenceBounds bounds={t.reference_bounds} couplings={t.couplings} />
        </Section>
      )}
      <Section id="references" title="References">
        <ReferencesList references={t.references} />
      </Section>
      <Section id="history" title="Revision history">
        <RevisionHistory slug={t.slug} current={t.revision.number} />
      </Section>
      {editorTools}
    </article>
  );
}
