/**
 * Small builders for the catalogue entries written in the submission shape: the validity conditions,
 * dipole and 2PN-coefficient mappings and two-sided published intervals that several entries share,
 * and `defineEntry`, which fills an entry's reference list from the keys its parts cite (so a
 * reference is written once, where it is used).
 */
import type { ReferenceInput, TheoryEntryInput } from "../../common/catalogue.ts";

type MappingInput = TheoryEntryInput["mappings"][number];
type ValidityInput = NonNullable<MappingInput["validity"]>[number];
type ReferenceBoundInput = NonNullable<TheoryEntryInput["reference_bounds"]>[number];
type KeyedReference = ReferenceInput & { key: string };

/** Where a threshold that stands for "much less than 1" comes from. */
export const muchLessThanOne = (max: number): string => `project choice: ${max} stands for 'much less than 1'`;

/** A rule-of-thumb validity condition; the threshold (0.1 unless given) is a project choice unless a reference is given. */
export function ruleOfThumb(
  expression: string,
  label: string,
  options: { max?: number; reference?: string; body?: 1 | 2; applies_to?: ("bh" | "ns")[] } = {},
): ValidityInput {
  const max = options.max ?? 0.1;
  return {
    expression,
    max,
    label,
    kind: "rule_of_thumb",
    reference: options.reference ?? muchLessThanOne(max),
    ...(options.body === undefined ? {} : { body: options.body }),
    ...(options.applies_to === undefined ? {} : { applies_to: options.applies_to }),
  };
}

/** Dipole-to-quadrupole flux ratio B v^-2 small at the band's low end, v = (pi M f_low)^(1/3). */
export const dipoleAtLowEnd = (B: string): ValidityInput =>
  ruleOfThumb(
    `${B}*(pi*M*f_low)^(-2/3)`,
    "dipole flux small against the quadrupole flux over the band: B v⁻² below 0.1 at the band's low end, v = (π M f_low)^(1/3)",
  );

/**
 * A -1PN dipole term from the flux ratio F_dip / F_GR = B v^-2 and an unchanged binding energy: energy
 * balance gives beta = -(3/224) eta^(2/5) B at b = -7 (Yunes & Pretorius 2009 form; derived). The
 * expression and its LaTeX are given as written (simplified), the engine re-derives them from B.
 */
export function dipoleMapping(
  fields: Omit<MappingInput, "kind" | "pn_order" | "b" | "derivation"> & { B: string; flux_note: string },
): MappingInput {
  const { B, flux_note, ...rest } = fields;
  return {
    kind: "inspiral_phase",
    pn_order: -1,
    b: -7,
    derivation: { kind: "energy_flux", order: -1, A: "0", B, note: flux_note },
    ...rest,
  };
}

/** The prefactor of a 2PN change d phi_4 of the phase coefficient written as -(75/64) eta^(-4/5) x with d phi_4 = -50 x: beta = (3/128) eta^(-4/5) d phi_4. */
export const QM_PREFACTOR = "-(75/64)*eta^(-4/5)";

/** A two-sided published interval [lo, hi] of one quantity, as a lower and an upper reference bound sharing everything else. */
export function intervalBounds(common: Omit<ReferenceBoundInput, "value" | "side">, lo: number, hi: number): ReferenceBoundInput[] {
  return [
    { ...common, value: hi, side: "upper" },
    { ...common, value: lo, side: "lower" },
  ];
}

/**
 * An entry whose `references` are the ones its mappings, body rules, validity conditions, conventions
 * and bounds cite (looked up by key in `library`), in first-cited order, followed by `also` (references
 * listed for reading but cited by no part). A key not in the library is an error at module load.
 */
export function defineEntry(
  entry: Omit<TheoryEntryInput, "references">,
  library: readonly KeyedReference[],
  also: readonly KeyedReference[] = [],
): TheoryEntryInput {
  const byKey = new Map(library.map((r) => [r.key, r] as const));
  for (const r of also) byKey.set(r.key, r);
  const cited: string[] = [];
  const cite = (key: string | undefined) => {
    if (key !== undefined && byKey.has(key) && !cited.includes(key)) cited.push(key);
  };
  const citeStrict = (key: string) => {
    if (!byKey.has(key)) throw new Error(`${entry.slug}: cites "${key}", which is not in the reference library`);
    cite(key);
  };
  for (const m of entry.mappings) {
    for (const k of m.references ?? []) citeStrict(k);
    for (const r of m.body_rules ?? []) if (r.reference !== undefined) citeStrict(r.reference);
    // A validity condition's reference is a key or a free-text note: only keys are collected.
    for (const v of m.validity ?? []) cite(v.reference);
  }
  for (const c of entry.couplings) for (const cv of c.conventions ?? []) if (cv.reference !== undefined) citeStrict(cv.reference);
  for (const b of entry.reference_bounds ?? []) citeStrict(b.reference);
  for (const r of also) cite(r.key);
  return { ...entry, references: cited.map((k) => byKey.get(k) as KeyedReference) };
}
