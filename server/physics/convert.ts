/**
 * The conversion core: a bound on a theory-agnostic deviation (ppE beta at b, or a gIMR dphi_k)
 * becomes a limit on one theory's coupling for one binary.
 *
 * Algorithm (docs/physics-numbers.md): resolve the bound to |beta| <= beta_max at b in the +Psi
 * convention; build the binary's symbols (source-frame masses in km, distances in km when the
 * mapping is a propagation effect); if beta = F(x) is a power law in the coupling x, invert in
 * closed form, x_lim = (beta_max / |F(1)|)^(1/p); otherwise find the root of |F(x)| = beta_max on
 * a log scale; finally evaluate the mapping's validity conditions at the limit.
 */
import { binarySymbols, makeBinary, type Binary, type BinaryInput } from "./binary.ts";
import type {
  BoundInput,
  ConversionResult,
  ConvertOptions,
  CouplingSpec,
  Env,
  MappingSpec,
  NoConstraintCode,
  NoConstraintResult,
  ValidityResult,
} from "./convert-types.ts";
import { distanceAlphaKm, PLANCK_2018, validateCosmology, type Cosmology } from "./cosmology.ts";
import { PhysicsInputError, requireFinite } from "./input-error.ts";
import { detectPowerLaw, fractionString, solveMagnitude } from "./invert.ts";
import { formatLatexNumber, unitLatex } from "./latex-format.ts";
import { presentLimit, type QuotedValue, type Side } from "./quoted-forms.ts";
import { degeneracyOfB, gimrFactor, normaliseSign } from "./taylorf2.ts";

export type * from "./convert-types.ts";

// ---------------------------------------------------------------------------------------------
// Context shared by every mapping converted for the same binary (the fast path).

export interface ConversionContext {
  readonly binary: Binary;
  readonly cosmology: Cosmology;
  readonly symbols: Env;
  /** Symbols plus the distance measure a mapping needs (cached per alpha_md). */
  envFor(mapping: MappingSpec): Env;
}

export function createConversionContext(binary: Binary | BinaryInput, options: ConvertOptions = {}): ConversionContext {
  const b = isBinary(binary) ? binary : makeBinary(binary);
  const cosmology = validateCosmology(options.cosmology ?? PLANCK_2018);
  const symbols = binarySymbols(b);
  const distances = new Map<number, number>();
  const distance = (alphaMd: number): number => {
    let d = distances.get(alphaMd);
    if (d === undefined) {
      if (b.z === undefined) throw new PhysicsInputError("z", "this mapping is a propagation effect: it needs the redshift z");
      d = distanceAlphaKm(b.z, alphaMd, cosmology);
      distances.set(alphaMd, d);
    }
    return d;
  };
  const envCache = new Map<number, Env>();
  return {
    binary: b,
    cosmology,
    symbols,
    envFor(mapping) {
      if (!mapping.distance) return symbols;
      const a = mapping.distance.alphaMd;
      let env = envCache.get(a);
      if (!env) {
        env = { ...symbols, D_alpha: distance(a), D_0: distance(0) };
        envCache.set(a, env);
      }
      return env;
    },
  };
}

function isBinary(x: Binary | BinaryInput): x is Binary {
  return "km" in x && "eta" in x;
}

/** The field a missing symbol comes from, so the error lands on the right input. */
function fieldOfSymbol(symbol: string): string {
  if (symbol === "D_0" || symbol === "D_alpha" || symbol === "z") return "z";
  if (symbol === "sigma1") return "scalar_sensitivities.0";
  if (symbol === "sigma2") return "scalar_sensitivities.1";
  return symbol;
}

// ---------------------------------------------------------------------------------------------
// Bound resolution

interface ResolvedBound {
  readonly b: number;
  /** [low, high] in the +Psi convention; symmetric bounds give [-beta_max, beta_max]. */
  readonly low: number;
  readonly high: number;
  readonly symmetric: boolean;
  readonly cautions: readonly string[];
}

function resolveInterval(field: string, max: number | undefined, interval: readonly [number, number] | undefined) {
  if ((max === undefined) === (interval === undefined)) {
    throw new PhysicsInputError(field, `give exactly one of ${field} and interval`);
  }
  if (max !== undefined) {
    requireFinite(field, max);
    if (max <= 0) throw new PhysicsInputError(field, `${field} must be positive`);
    return { low: -max, high: max, symmetric: true };
  }
  const [low, high] = interval!;
  requireFinite("interval.0", low);
  requireFinite("interval.1", high);
  if (!(low < high)) throw new PhysicsInputError("interval", "interval must satisfy low < high");
  return { low, high, symmetric: false };
}

function resolveBound(bound: BoundInput, binary: Binary): ResolvedBound | NoConstraintResult {
  if (bound.kind === "ppe") {
    const b = requireFinite("b", bound.b);
    const degenerate = degeneracyOfB(b);
    if (degenerate) return noConstraint("degenerate_b", degenerate);
    const r = resolveInterval("beta_max", bound.beta_max, bound.interval);
    const convention = bound.convention ?? "plus";
    const lo = normaliseSign(r.low, convention);
    const hi = normaliseSign(r.high, convention);
    return { b, low: Math.min(lo, hi), high: Math.max(lo, hi), symmetric: r.symmetric, cautions: [] };
  }
  const f = gimrFactor(bound.k, binary.eta, {
    includesSpin: bound.includes_spin ?? false,
    spins: { eta: binary.eta, dm: binary.dm, chi_s: binary.chi_s, chi_a: binary.chi_a, bodies: binary.bodies },
  });
  if (f.status !== "ok") return noConstraint(f.status === "degenerate" ? "degenerate_b" : "no_ppe_equivalent", f.reason);
  const r = resolveInterval("dphi_max", bound.dphi_max, bound.interval);
  const a = f.factor * r.low;
  const c = f.factor * r.high;
  return { b: f.b, low: Math.min(a, c), high: Math.max(a, c), symmetric: r.symmetric, cautions: f.cautions };
}

function noConstraint(code: NoConstraintCode, reason: string, warnings: string[] = [], cautions: readonly string[] = []): NoConstraintResult {
  return { status: "no_constraint", code, reason, warnings, cautions: [...cautions] };
}

// ---------------------------------------------------------------------------------------------
// Conversion

const SIGN_PROBES = [1e-6, 1e-3, 1, 1e3, 1e6] as const;

export function convertToCoupling(
  bound: BoundInput,
  binary: Binary | BinaryInput,
  mapping: MappingSpec,
  options: ConvertOptions = {},
): ConversionResult {
  return convertInContext(bound, createConversionContext(binary, options), mapping);
}

/** Many mappings, one bound and one binary: the binary, cosmology and distances are computed once. */
export function convertMany(
  bound: BoundInput,
  binary: Binary | BinaryInput,
  mappings: readonly MappingSpec[],
  options: ConvertOptions = {},
): ConversionResult[] {
  const context = createConversionContext(binary, options);
  return mappings.map((m) => convertInContext(bound, context, m));
}

export function convertInContext(bound: BoundInput, context: ConversionContext, mapping: MappingSpec): ConversionResult {
  const { binary } = context;
  const resolved = resolveBound(bound, binary);
  if ("status" in resolved) return resolved;
  if (Math.abs(resolved.b - mapping.b) > 1e-12) {
    throw new PhysicsInputError("b", `the bound is at b = ${resolved.b} but this mapping enters at b = ${mapping.b}`);
  }
  const env = context.envFor(mapping);
  for (const s of mapping.requires ?? []) {
    if (env[s] === undefined) {
      throw new PhysicsInputError(fieldOfSymbol(s), `this mapping needs ${s}, which the binary does not provide`);
    }
  }
  const warnings: string[] = [];
  const cautions: string[] = [...resolved.cautions, ...(mapping.cautions ?? [])];
  if (mapping.derivedFor) {
    const others = binary.bodies.filter((k) => !mapping.derivedFor!.includes(k));
    if (others.length > 0) cautions.push(`the mapping was derived for ${mapping.derivedFor.join("/")} bodies; this binary has ${binary.bodies.join("-")}`);
  }

  const F = mapping.bind ? mapping.bind(env) : (x: number) => mapping.evaluate(x, env);

  // Theory sign over the probes, and the vanishing case (e.g. equal-mass, equal-spin EdGB).
  const probeValues = SIGN_PROBES.map(F);
  if (probeValues.some(Number.isNaN)) {
    throw new PhysicsInputError(mapping.coupling.symbol, "the mapping does not evaluate to a number for this binary");
  }
  if (probeValues.every((v) => v === 0)) {
    return noConstraint(
      "vanishing_mapping",
      "beta vanishes for this binary at every coupling (e.g. equal masses and spins emit no scalar dipole): this binary constrains nothing",
      warnings,
      cautions,
    );
  }
  const positive = probeValues.every((v) => v >= 0);
  const negative = probeValues.every((v) => v <= 0);
  const theorySign: -1 | 0 | 1 = positive ? 1 : negative ? -1 : 0;

  // One-signed theories use the side of the interval they can populate.
  let betaMax: number;
  if (resolved.symmetric) {
    betaMax = resolved.high;
  } else if (resolved.low > 0 || resolved.high < 0) {
    return noConstraint("interval_excludes_gr", "the interval excludes beta = 0: it is a deviation, not a bound", warnings, cautions);
  } else if (theorySign === 1) {
    betaMax = resolved.high;
  } else if (theorySign === -1) {
    betaMax = -resolved.low;
  } else {
    betaMax = Math.max(-resolved.low, resolved.high);
    warnings.push("beta changes sign with the coupling: the wider side of the interval is used (conservative)");
  }
  if (betaMax === 0) {
    return noConstraint("interval_excludes_gr", "the interval ends at beta = 0 on the side this theory predicts", warnings, cautions);
  }

  let x: number;
  let side: Side;
  let method: "closed_form" | "numeric_root" = "numeric_root";
  let power: number | undefined;
  let prefactor: number | undefined;
  const law = detectPowerLaw(F);
  if (law && law.power === 0) {
    return noConstraint("coupling_independent", "beta does not depend on the coupling for this binary", warnings, cautions);
  }
  if (law && law.prefactor > 0) {
    const candidate = (betaMax / law.prefactor) ** (1 / law.power);
    const check = Math.abs(F(candidate));
    if (Number.isFinite(candidate) && candidate > 0 && Math.abs(check / betaMax - 1) < 1e-10) {
      x = candidate;
      side = law.power > 0 ? "upper" : "lower";
      method = "closed_form";
      power = law.power;
      prefactor = law.prefactor;
    }
  }
  if (method === "numeric_root") {
    const [lo, hi] = mapping.domain ?? [1e-60, 1e60];
    const root = solveMagnitude(F, betaMax, lo, hi);
    if (root.kind === "none") return noConstraint("out_of_range", root.reason, warnings, cautions);
    x = root.x;
    side = root.side;
    if (!root.monotonic) {
      warnings.push(
        `|beta| is not monotonic in ${mapping.coupling.symbol}: the limit is the edge of the allowed region that contains GR; further allowed intervals may exist`,
      );
    }
  }

  const validity = evaluateValidity(mapping, x!, env, binary);
  const valid = validity.every((v) => v.ok || v.kind !== "hard");
  for (const v of validity) {
    if (!v.ok && v.kind === "rule_of_thumb") warnings.push(`rule of thumb not met at the limit: ${v.label} (${v.condition}; value ${v.value.toPrecision(3)})`);
  }

  const presented = presentLimit(x!, side!, mapping.coupling.quoted);
  const conventions = (mapping.coupling.conventions ?? []).map((c) => ({
    name: c.name,
    factor: c.factor,
    quoted: presentLimit(x! / c.factor, side!, mapping.coupling.quoted).primary,
  }));
  const spec = mapping.coupling;
  return {
    status: "bounded",
    side: side!,
    coupling: { symbol: spec.symbol, latex: spec.latex, value: x!, unit: spec.unit },
    quoted: presented.primary,
    extras: presented.extras,
    conventions,
    method,
    ...(power === undefined ? {} : { power, prefactor: prefactor! }),
    latex: limitLatex(spec, side!, x!, betaMax, presented.primary, method, power, prefactor),
    b: mapping.b,
    beta_max: betaMax,
    theory_sign: theorySign,
    beta_at_limit: F(x!),
    validity,
    valid,
    warnings,
    cautions,
  };
}

function evaluateValidity(mapping: MappingSpec, x: number, env: Env, binary: Binary): ValidityResult[] {
  const out: ValidityResult[] = [];
  for (const c of mapping.validity ?? []) {
    if (c.body && c.appliesTo && !c.appliesTo.includes(binary.bodies[c.body - 1]!)) continue;
    const value = c.evaluate(x, env);
    out.push({
      label: c.label,
      condition: c.condition,
      value,
      max: c.max,
      ok: Number.isFinite(value) && value <= c.max,
      kind: c.kind,
      ...(c.reference ? { reference: c.reference } : {}),
    });
  }
  return out;
}

function limitLatex(
  spec: CouplingSpec,
  side: Side,
  x: number,
  betaMax: number,
  quoted: QuotedValue,
  method: "closed_form" | "numeric_root",
  power: number | undefined,
  prefactor: number | undefined,
): string {
  const sub = side === "upper" ? "\\max" : "\\min";
  const unit = unitLatex(spec.unit);
  const unitSpace = unit ? `\\,${unit}` : "";
  const rel = side === "upper" ? "\\le" : "\\ge";
  const quotedUnit = unitLatex(quoted.unit);
  const quotedPart = `${quoted.latex} ${rel} ${formatLatexNumber(quoted.value)}${quotedUnit ? `\\,${quotedUnit}` : ""}`;
  if (method === "closed_form" && power !== undefined && prefactor !== undefined) {
    const exponent = fractionString(1 / power);
    const raise = exponent === "1" ? "" : `^{${exponent}}`;
    const one = `${spec.latex} = 1${unitSpace}`;
    return (
      `{${spec.latex}}_{${sub}} = \\left(\\frac{\\beta_{\\max}}{|\\beta(${one})|}\\right)${raise}` +
      ` = \\left(\\frac{${formatLatexNumber(betaMax)}}{${formatLatexNumber(prefactor)}}\\right)${raise}` +
      ` = ${formatLatexNumber(x)}${unitSpace}, \\qquad ${quotedPart}`
    );
  }
  return `|\\beta(${spec.latex})| = ${formatLatexNumber(betaMax)} \\;\\Rightarrow\\; {${spec.latex}}_{${sub}} = ${formatLatexNumber(x)}${unitSpace}, \\qquad ${quotedPart}`;
}
