import type { TheoryDetail } from "../../../../common/catalogue.ts";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { Badge } from "../../../components/ui/badge.tsx";
import { CheckBadge, CheckList, worstOutcome } from "../../../components/ui/check-list.tsx";
import { MathTex } from "../../../components/ui/math-tex.tsx";
import { thresholdText } from "../../../components/ui/text-format.ts";
import { RetiredBadge, RetiredNote } from "./retirement.tsx";
import { authorList, equationTex, pnLabel, signed } from "./format.ts";
import { SourceStatusBadge } from "./source-status.tsx";

type StoredMapping = TheoryDetail["mappings"][number];
type StoredCoupling = TheoryDetail["couplings"][number];

/**
 * A coupling as people name it: its symbol, the first clause of its description, and the identifier
 * scripts use only as a small "API name" detail.
 */
function CouplingName({ id, couplings }: { id: string; couplings: StoredCoupling[] }) {
  const c = couplings.find((x) => x.symbol === id);
  const name = c?.description ? conditionText(c.description.split(";")[0]!.trim()) : null;
  return (
    <span>
      <MathTex tex={c?.latex ?? id} label={symbolText(id, c?.latex)} />
      {name && <span className="ml-2">{name}</span>}
      <span className="ml-2 text-xs text-ink-faint" data-machine>
        API name <code>{id}</code>
      </span>
    </span>
  );
}

const kindLabel: Record<StoredMapping["kind"], string> = {
  inspiral_phase: "Inspiral phase (ppE β)",
  inspiral_amplitude: "Inspiral amplitude (ppE α)",
  ringdown_frequency: "Ringdown frequency shift",
  ringdown_damping: "Ringdown damping-time shift",
  remnant_mass: "Remnant mass shift",
  remnant_spin: "Remnant spin shift",
};

/** The deviation parameter each kind of mapping gives, for expressions stored without their left-hand side. */
const lhsTex: Record<StoredMapping["kind"], string> = {
  inspiral_phase: "\\beta",
  inspiral_amplitude: "\\alpha_{\\rm ppE}",
  ringdown_frequency: "\\delta\\omega/\\omega",
  ringdown_damping: "\\delta\\tau/\\tau",
  remnant_mass: "\\delta M_f/M_f",
  remnant_spin: "\\delta\\chi_f/\\chi_f",
};

function exponentTex(m: StoredMapping): string | undefined {
  if (m.kind === "inspiral_phase" && m.b !== null) return `b = ${m.b}`;
  if (m.kind === "inspiral_amplitude" && m.a !== null) return `a = ${m.a}`;
  if (m.mode) return `(\\ell, m, n) = (${m.mode.l}, ${m.mode.m}, ${m.mode.n})`;
  return undefined;
}

function MappingCard({ m, index, couplings }: { m: StoredMapping; index: number; couplings: StoredCoupling[] }) {
  const all = [...m.checks, ...m.validity.flatMap((v) => v.checks)];
  const outcome = worstOutcome(all);
  const exponent = exponentTex(m);
  return (
    <article className="rounded border border-paper-edge bg-white/40 p-4" data-testid={`mapping-${index}`}>
      <header className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <h3 className="text-lg">{kindLabel[m.kind]}</h3>
        {exponent && <MathTex tex={exponent} />}
        {m.pn_order !== null && <span className="text-sm text-ink-soft tabular-nums">{pnLabel(m.pn_order)}</span>}
        <span className="ml-auto flex min-w-0 flex-wrap gap-2">
          {m.retired && <RetiredBadge retired={m.retired} />}
          <SourceStatusBadge status={m.source_to_be_confirmed ? "memory" : m.source_status} />
          <CheckBadge outcome={outcome} title={`${all.length} engine checks`} />
        </span>
      </header>
      {m.retired && <RetiredNote retired={m.retired} what="This mapping" />}
      <div className="my-3 overflow-x-auto rounded bg-paper px-3 py-2">
        <MathTex display tex={equationTex(lhsTex[m.kind], m.latex)} />
      </div>
      <p className="text-xs text-ink-faint break-all" data-machine>
        <span className="font-serif">as the engine reads it: </span>
        <span className="font-mono">{m.expression}</span>
      </p>
      <dl className="mt-3 grid gap-x-6 gap-y-2 text-[0.95rem] sm:grid-cols-[10rem_1fr]">
        <dt className="font-semibold">Constrains</dt>
        <dd className="text-sm">
          <CouplingName id={m.coupling} couplings={couplings} />
          {m.held_fixed && Object.keys(m.held_fixed).length > 0 && (
            <span className="block text-ink-soft">
              with {Object.entries(m.held_fixed).map(([k, v]) => `${symbolText(k, couplings.find((c) => c.symbol === k)?.latex)} = ${v}`).join(", ")} held fixed
            </span>
          )}
        </dd>
        {m.derivation && (
          <>
            <dt className="font-semibold">Derived from</dt>
            <dd className="text-sm">
              {m.derivation.kind === "energy_flux" && (
                <span>
                  energy and flux change at order <span className="tabular-nums">{signed(m.derivation.order)}</span>
                  {m.derivation.A !== undefined && <span className="block font-mono" data-machine>A = {m.derivation.A}</span>}
                  {m.derivation.B !== undefined && <span className="block font-mono" data-machine>B = {m.derivation.B}</span>}
                </span>
              )}
              {m.derivation.kind === "frequency_drift" && <span className="font-mono" data-machine>γ = {m.derivation.gamma}</span>}
              {m.derivation.kind === "propagation" && <span>propagation over cosmological distance</span>}
              {m.derivation.note && <span className="block text-ink-soft">{conditionText(m.derivation.note)}</span>}
            </dd>
          </>
        )}
        {m.gimr_equivalent && (
          <>
            <dt className="font-semibold">gIMR form</dt>
            <dd className="text-sm">
              <MathTex tex={`\\delta\\varphi_{${m.gimr_equivalent.k}}`} /> = <span className="font-mono" data-machine>{m.gimr_equivalent.expression}</span>
            </dd>
          </>
        )}
        {m.frame_note && (
          <>
            <dt className="font-semibold">Frame</dt>
            <dd className="text-sm">{conditionText(m.frame_note)}</dd>
          </>
        )}
        {m.body_rules.length > 0 && (
          <>
            <dt className="font-semibold">Bodies</dt>
            <dd className="text-sm">
              <ul className="list-disc pl-5">
                {m.body_rules.map((r, i) => (
                  <li key={i}>{conditionText(r.description)}</li>
                ))}
              </ul>
            </dd>
          </>
        )}
        {m.references.length > 0 && (
          <>
            <dt className="font-semibold">Sources</dt>
            <dd className="text-sm">
              {m.references.map((r) => `${authorList(r.authors, 2)} ${r.year}`).join("; ")}
              {m.locator && <span className="text-ink-soft">, {conditionText(m.locator)}</span>}
            </dd>
          </>
        )}
      </dl>
      {m.validity.length > 0 && (
        <section className="mt-3 border-t border-paper-edge pt-3">
          <h4 className="text-sm font-semibold mb-1">Valid while</h4>
          <ul className="flex flex-col gap-2">
            {m.validity.map((v, i) => (
              <li key={i} className="flex flex-wrap items-center gap-x-3 gap-y-1 text-[0.95rem]" data-testid={`validity-${index}-${i}`}>
                <MathTex tex={`\\displaystyle ${v.latex} < ${thresholdText(v.max)}`} />
                <span className="text-sm text-ink-soft">{conditionText(v.label)}</span>
                <Badge tone={v.kind === "hard" ? "fail" : "neutral"}>{v.kind === "hard" ? "hard limit" : "rule of thumb"}</Badge>
                {v.applies_to && <span className="text-xs text-ink-faint">only for {v.applies_to.join(" / ").toUpperCase()}{v.body ? `, body ${v.body}` : ""}</span>}
                {v.source_status === "memory" && <Badge tone="caution">source to be confirmed</Badge>}
                {v.checks.some((c) => !c.ok) && <CheckBadge outcome={worstOutcome(v.checks)} />}
              </li>
            ))}
          </ul>
        </section>
      )}
      <details className="mt-3 border-t border-paper-edge pt-2">
        <summary className="cursor-pointer text-sm text-sea">Engine checks ({all.length})</summary>
        <div className="mt-2">
          <CheckList checks={all} />
        </div>
      </details>
      {m.caution && <p className="mt-2 text-sm">{conditionText(m.caution)}</p>}
      {m.notes && <p className="mt-2 text-sm text-ink-soft">{conditionText(m.notes)}</p>}
    </article>
  );
}

export function MappingsList({ mappings, couplings }: { mappings: StoredMapping[]; couplings: StoredCoupling[] }) {
  return (
    <div className="flex flex-col gap-4">
      {mappings.map((m, i) => (
        <MappingCard key={m.id} m={m} index={i} couplings={couplings} />
      ))}
    </div>
  );
}
