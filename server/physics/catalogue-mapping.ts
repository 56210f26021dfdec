/**
 * Turns a catalogue entry's mapping (expression strings, as stored) into a MappingSpec the
 * converter runs: definitions are expanded by the expression layer, the result is compiled once,
 * and the compiled functions are cached per entry object for the fast path.
 *
 * The input type is structural (the shape of seeds/data/theory-entry.ts and of the database
 * rows), so the server does not import seed data.
 */
import { thresholdText } from "../../common/number-text.ts";
import type { BodyKind } from "./binary.ts";
import type { CouplingSpec, Env, MappingChannel, MappingSpec, ValidityCondition } from "./convert.ts";
import { compileExpression } from "./expr/compile.ts";
import { guardExpression } from "./expr/guard.ts";
import { createSymbolTable, expandDefinitions, type SymbolTable } from "./expr/symbols.ts";
import { PhysicsInputError } from "./input-error.ts";
import { QUOTED_FORM_NAMES, type QuotedFormName } from "./quoted-forms.ts";

export interface CatalogueCoupling {
  readonly symbol: string;
  readonly latex: string;
  readonly dimension: string;
  readonly unit: string;
  readonly quoted?: {
    readonly form: string;
    readonly symbol: string;
    readonly latex: string;
    readonly unit: string;
    readonly alpha_md?: number;
  };
  readonly convention?: string;
  readonly conventions?: readonly { readonly name: string; readonly factor: number; readonly reference?: string }[];
  readonly range?: "positive" | "non_negative" | "any_sign";
  readonly gr_value?: "zero" | "infinity";
}

export interface CatalogueValidity {
  readonly expression: string;
  readonly max: number;
  readonly label: string;
  readonly kind?: "hard" | "rule_of_thumb";
  readonly reference?: string;
  readonly body?: 1 | 2;
  readonly applies_to?: readonly BodyKind[];
}

export interface CatalogueMapping {
  readonly kind: string;
  readonly b: number;
  /** ppE amplitude exponent (inspiral_amplitude). */
  readonly a?: number;
  readonly expression: string;
  readonly coupling?: string;
  readonly held_fixed?: Readonly<Record<string, number>>;
  readonly alpha_md?: number;
  readonly validity?: readonly CatalogueValidity[];
  readonly body_rules?: readonly { readonly kind: string; readonly bodies?: readonly BodyKind[]; readonly description?: string }[];
  readonly source_status?: "confirmed" | "derived" | "memory";
  /** Shown beside every translation with this mapping. */
  readonly caution?: string;
}

export interface CatalogueTheory {
  readonly slug: string;
  readonly couplings: readonly CatalogueCoupling[];
  readonly definitions?: readonly { readonly symbol: string; readonly expression: string }[];
  readonly mappings: readonly CatalogueMapping[];
}

export interface CompiledMapping extends MappingSpec {
  readonly slug: string;
  readonly index: number;
  /** The stored expression and the same in primitive symbols only. */
  readonly expression: string;
  readonly expanded: string;
  readonly sourceStatus?: "confirmed" | "derived" | "memory";
  /** Other couplings of the expression and the values they are held at (their GR values). */
  readonly heldFixed?: Readonly<Record<string, number>>;
}

/**
 * Binary inputs some theories need beyond the expression layer's built-in primitives: the
 * scalar-tensor sensitivities. Declared to the symbol table as dimensionless inputs.
 */
const EXTRA_INPUTS = [
  { symbol: "sigma1", dimension: 0, description: "scalar-tensor sensitivity of body 1" },
  { symbol: "sigma2", dimension: 0, description: "scalar-tensor sensitivity of body 2" },
] as const;

/** Environment symbols that come from optional inputs; a mapping using one lists it as required. */
const OPTIONAL_INPUTS = new Set(["z", "D", "D_0", "D_alpha", "sigma1", "sigma2"]);
// Omega_m is always in the converter's environment (from the request's cosmology).

/** The mapping kinds the translator runs, and the channel each gives (the amplitude's exponent a is held in `b`). */
const CHANNEL_OF_KIND: Readonly<Record<string, MappingChannel | undefined>> = {
  inspiral_phase: "phase",
  inspiral_amplitude: "amplitude",
};

/** "L^2" -> 2, "L" -> 1, "L^-1" -> -1, "1" -> 0. */
export function lengthPower(dimension: string): number {
  const d = dimension.replace(/\s+/g, "");
  if (d === "1" || d === "") return 0;
  const m = /^L(?:\^\(?(-?\d+(?:\.\d+)?)\)?)?$/.exec(d);
  if (!m) throw new PhysicsInputError("dimension", `dimension "${dimension}" is not a power of length (L^n)`);
  return m[1] === undefined ? 1 : Number(m[1]);
}

export function symbolTableFor(entry: CatalogueTheory): SymbolTable {
  const couplings = entry.couplings.map((c) => ({ symbol: c.symbol, dimension: lengthPower(c.dimension) }));
  const declared = new Set(couplings.map((c) => c.symbol));
  const extras = EXTRA_INPUTS.filter((x) => !declared.has(x.symbol));
  return createSymbolTable({ couplings: [...couplings, ...extras], definitions: entry.definitions ?? [] });
}

interface Compiled {
  readonly fn: (values: ArrayLike<number>) => number;
  readonly expanded: string;
  readonly used: ReadonlySet<string>;
}

function compileIn(expression: string, table: SymbolTable, args: readonly string[]): Compiled {
  const expanded = expandDefinitions(expression, table);
  const used = new Set(guardExpression(expanded, { symbols: args }).symbols.keys());
  return { fn: compileExpression(expanded, args), expanded, used };
}

function isQuotedForm(x: string): x is QuotedFormName {
  return (QUOTED_FORM_NAMES as readonly string[]).includes(x);
}

function couplingSpec(c: CatalogueCoupling): CouplingSpec {
  const q = c.quoted;
  if (q && !isQuotedForm(q.form)) throw new PhysicsInputError("quoted.form", `unknown quoted form "${q.form}"`);
  return {
    symbol: c.symbol,
    latex: c.latex,
    unit: c.unit,
    quoted: q
      ? {
          form: q.form as QuotedFormName,
          symbol: q.symbol,
          latex: q.latex,
          unit: q.unit,
          ...(q.alpha_md === undefined ? {} : { alphaMd: q.alpha_md }),
        }
      : { form: "identity", symbol: c.symbol, latex: c.latex, unit: c.unit },
    ...(c.convention ? { convention: c.convention } : {}),
    ...(c.range ? { range: c.range } : {}),
    ...(c.gr_value ? { grValue: c.gr_value } : {}),
    ...(c.conventions ? { conventions: c.conventions.map((k) => ({ name: k.name, factor: k.factor, ...(k.reference ? { reference: k.reference } : {}) })) } : {}),
  };
}

/** Compiles mapping `index` of `entry`. Throws ExpressionError for a bad expression. */
export function compileMapping(entry: CatalogueTheory, index: number): CompiledMapping {
  const mapping = entry.mappings[index];
  if (!mapping) throw new RangeError(`${entry.slug} has no mapping ${index}`);
  const channel = CHANNEL_OF_KIND[mapping.kind];
  if (!channel) throw new PhysicsInputError("kind", `mapping kind "${mapping.kind}" is not an inspiral phase or amplitude`);
  const couplingSymbol = mapping.coupling ?? entry.couplings[0]?.symbol;
  const coupling = entry.couplings.find((c) => c.symbol === couplingSymbol);
  if (!coupling) throw new PhysicsInputError("coupling", `${entry.slug}: mapping ${index} names no declared coupling`);

  const table = symbolTableFor(entry);
  const args = table.primitives;
  const couplingIndex = args.indexOf(coupling.symbol);
  const fixed = Object.entries(mapping.held_fixed ?? {}).map(([name, value]) => {
    const k = args.indexOf(name);
    if (k < 0) throw new PhysicsInputError("held_fixed", `${entry.slug}: held_fixed names unknown coupling "${name}"`);
    return [k, value] as const;
  });

  const main = compileIn(mapping.expression, table, args);
  const requires = new Set([...main.used].filter((s) => OPTIONAL_INPUTS.has(s)));
  const otherCouplings = entry.couplings.map((c) => c.symbol).filter(
    (s) => s !== coupling.symbol && main.used.has(s) && !(mapping.held_fixed && s in mapping.held_fixed),
  );
  if (otherCouplings.length > 0) {
    throw new PhysicsInputError("held_fixed", `${entry.slug}: the expression also uses ${otherCouplings.join(", ")}; hold them fixed`);
  }

  const bindValues = (env: Env): Float64Array => {
    const values = new Float64Array(args.length);
    args.forEach((name, k) => (values[k] = env[name] ?? Number.NaN));
    for (const [k, v] of fixed) values[k] = v;
    return values;
  };
  const bindFn = (fn: Compiled["fn"]) => (env: Env) => {
    const values = bindValues(env);
    return (x: number) => {
      values[couplingIndex] = x;
      return fn(values);
    };
  };
  const bind = bindFn(main.fn);

  const validity: ValidityCondition[] = (mapping.validity ?? []).map((v) => {
    const c = compileIn(v.expression, table, args);
    for (const s of c.used) if (OPTIONAL_INPUTS.has(s)) requires.add(s);
    const bound = bindFn(c.fn);
    return {
      label: v.label,
      // The engine expression with its threshold as people write it (1/6, not 0.16666666666666666).
      condition: `${v.expression} <= ${thresholdText(v.max)}`,
      evaluate: (x: number, env: Env) => bound(env)(x),
      max: v.max,
      kind: v.kind ?? "rule_of_thumb",
      ...(v.reference ? { reference: v.reference } : {}),
      ...(v.body ? { body: v.body } : {}),
      ...(v.applies_to ? { appliesTo: v.applies_to } : {}),
    };
  });

  const usesDistance = main.used.has("D_0") || main.used.has("D_alpha");
  if (main.used.has("D_alpha") && mapping.alpha_md === undefined) {
    throw new PhysicsInputError("alpha_md", `${entry.slug}: a mapping using D_alpha must give alpha_md`);
  }
  const derivedFor = mapping.body_rules?.find((r) => r.kind === "derived_for")?.bodies;
  const onlyForRule = mapping.body_rules?.find((r) => r.kind === "only_for" && r.bodies && r.bodies.length > 0);
  const cautions: string[] = [];
  if (mapping.source_status === "memory") cautions.push("the mapping's formula is recalled from memory: source to be confirmed by an editor");
  if (mapping.caution) cautions.push(mapping.caution);

  return {
    slug: entry.slug,
    index,
    expression: mapping.expression,
    expanded: main.expanded,
    ...(mapping.source_status ? { sourceStatus: mapping.source_status } : {}),
    ...(fixed.length > 0 ? { heldFixed: { ...mapping.held_fixed } } : {}),
    b: channel === "amplitude" ? (mapping.a ?? Number.NaN) : mapping.b,
    channel,
    coupling: couplingSpec(coupling),
    evaluate: (x, env) => bind(env)(x),
    bind,
    requires: [...requires],
    ...(usesDistance ? { distance: { alphaMd: mapping.alpha_md ?? 0 } } : {}),
    validity,
    ...(derivedFor ? { derivedFor } : {}),
    ...(onlyForRule ? { onlyFor: { bodies: onlyForRule.bodies!, description: onlyForRule.description ?? "the entry's body rule" } } : {}),
    cautions,
  };
}

const cache = new WeakMap<CatalogueTheory, readonly CompiledMapping[]>();

/** Every mapping of an entry, compiled once per entry object. */
export function compileTheoryMappings(entry: CatalogueTheory): readonly CompiledMapping[] {
  let compiled = cache.get(entry);
  if (!compiled) {
    compiled = entry.mappings.map((_, i) => compileMapping(entry, i));
    cache.set(entry, compiled);
  }
  return compiled;
}
