// Run with: npx tsx bench/convert.bench.ts (or npm run bench). Not a test: it prints medians and
// ratios against baselines measured in the same run, and asserts nothing.
//
// What is timed: translating ONE bound against every entry of an in-process, already compiled
// catalogue (server/features/convert/translate.ts), i.e. the work of POST /api/v1/convert after its
// catalogue cache is warm. The catalogue is built from the seeded entries without a database.
import nerdamer from "nerdamer";
import { convertRequestSchema, type ConvertRequest } from "../common/convert.ts";
import { THEORIES, type TheoryEntry } from "../seeds/data/theories.ts";
import { compileCatalogue, type CompiledCatalogue } from "../server/features/convert/compiled-catalogue.ts";
import { translate } from "../server/features/convert/translate.ts";
import { createSymbolTable, expandDefinitions } from "../server/physics/expr/symbols.ts";
import { lengthPower } from "../server/physics/catalogue-mapping.ts";
import { seedTheory } from "../tests/api/convert-fixture.ts";

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] ?? Number.NaN;
};

function time(label: string, runs: number, f: () => unknown): number {
  for (let i = 0; i < Math.min(50, runs); i++) f(); // warm-up: JIT and lazy caches
  const samples: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = process.hrtime.bigint();
    f();
    samples.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  const m = median(samples);
  process.stdout.write(`  ${label.padEnd(64)} median ${m.toFixed(4)} ms  (${runs} runs)\n`);
  return m;
}

/**
 * n entries that all enter at b = -7 and constrain this binary, cloned from the seeded EdGB and
 * generic-dipole entries: every one is converted (Brans-Dicke is left out: two black holes carry the
 * same sensitivity, so it constrains nothing here and would be skipped cheaply).
 */
function catalogueAtOneB(n: number): CompiledCatalogue {
  const sources = THEORIES.filter((t) => t.slug === "edgb" || t.slug === "scalar-dipole");
  const entries: TheoryEntry[] = Array.from({ length: n }, (_, i) => {
    const t = sources[i % sources.length]!;
    return { ...t, slug: `${t.slug}-${i}` };
  });
  return compileCatalogue({ revision: "bench", theories: entries.map(seedTheory) });
}

/** Exactly 20 entries: the seeded catalogue, padded with clones of its b = -7 entries. */
function mixedCatalogue(n: number): CompiledCatalogue {
  const pad = THEORIES.filter((t) => t.mappings.some((m) => m.b === -7));
  const entries: TheoryEntry[] = [...THEORIES];
  for (let i = 0; entries.length < n; i++) entries.push({ ...pad[i % pad.length]!, slug: `pad-${i}` });
  return compileCatalogue({ revision: "bench", theories: entries.slice(0, n).map(seedTheory) });
}

const request: ConvertRequest = convertRequestSchema.parse({
  bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 },
  binary: { m1: 10, m2: 5, chi1: 0.3, chi2: 0.1, frame: "source", z: 0.2 },
});

process.stdout.write(`convert.bench: Node ${process.version}\n`);
const all20 = catalogueAtOneB(20);
const mixed20 = mixedCatalogue(20);
const applicable = translate(all20, request).results.length;
process.stdout.write(`  (20 entries at b = -7: ${applicable} translated; mixed catalogue: ${translate(mixed20, request).results.length} translated of 20)\n`);

const tAll = time("translate one bound, 20 entries all at b = -7 (compiled)", 2000, () => translate(all20, request));
const tMixed = time("translate one bound, 20-entry mixed catalogue (compiled)", 2000, () => translate(mixed20, request));

// Baseline 1: serialising the answer, work every request does anyway.
const answer = translate(all20, request);
const tJson = time("baseline: JSON.stringify of the 20-entry answer", 2000, () => JSON.stringify(answer));

// Baseline 2: the same mappings evaluated per call with nerdamer (no compilation), ONE evaluation
// of beta per entry at coupling = 1, where the compiled path evaluates each mapping 15+ times
// (power-law probes, sign probes, the check at the limit, the validity conditions).
const env: Record<string, string> = { m1: String(10 * 1.4766250385), m2: String(5 * 1.4766250385), chi1: "0.3", chi2: "0.1", s1: "0.9768", s2: "0.9975", z: "0.2" };
const expanded = all20.theories.map((t) => {
  const e = t.theory.entry;
  const table = createSymbolTable({ couplings: e.couplings.map((c) => ({ symbol: c.symbol, dimension: lengthPower(c.dimension) })), definitions: e.definitions ?? [] });
  return { text: expandDefinitions(e.mappings[0]!.expression, table), coupling: e.couplings[0]!.symbol };
});
const tNerdamer = time("baseline: nerdamer evaluate, one point per entry (20 entries)", 50, () => {
  for (const x of expanded) nerdamer(x.text, { ...env, [x.coupling]: "1" }).evaluate().text("decimals");
});

process.stdout.write("\nratios (same run):\n");
process.stdout.write(`  translate(20 at b=-7) / JSON.stringify(answer)      = ${(tAll / tJson).toFixed(2)}\n`);
process.stdout.write(`  nerdamer one-point-per-entry / translate(20 at b=-7) = ${(tNerdamer / tAll).toFixed(1)} (compiled path is this many times faster while evaluating each mapping 15+ times)\n`);
process.stdout.write(`  goal: median for 20 entries < 2 ms -> ${tAll < 2 ? "met" : "NOT met"} (${tAll.toFixed(3)} ms all-applicable, ${tMixed.toFixed(3)} ms mixed)\n`);
