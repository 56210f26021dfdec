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
import { conditionText, symbolText } from "../../common/symbol-text.ts";
import { binarySymbols, makeBinary, type Binary, type BinaryInput } from "./binary.ts";
import type {
  BoundInput,
  ConversionResult,
  ConvertOptions,
  CouplingSpec,
  Env,
  MappingChannel,
  MappingSpec,
  NoConstraintCode,
  NoConstraintResult,
  SignedInterval,
  ValidityResult,
} from "./convert-types.ts";
import { distanceAlphaKm, PLANCK_2018, validateCosmology, type Cosmology } from "./cosmology.ts";
import { PhysicsInputError, requireFinite } from "./input-error.ts";
import { detectPowerLaw, fractionString, solveMagnitude } from "./invert.ts";
import { formatLatexNumber, unitLatex } from "./latex-format.ts";
import { presentLimit, type QuotedValue, type Side } from "./quoted-forms.ts";
import { degeneracyOfB, gimrFactor, normaliseSign } from "./taylorf2.ts";
import { judgeCondition, verdictOf } from "./verdict.ts";

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
  // Omega_m: distance-ratio mappings of friction-type theories depend on the background (flat Lambda-CDM).
  const symbols = { ...binarySymbols(b, options.fLowHz), Omega_m: cosmology.Omega_m };
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
  readonly channel: MappingChannel;
  /** The deviation's LaTeX symbol in the closed form: beta or alpha. */
  readonly symbol: string;
  /** [low, high] in the +Psi convention; symmetric bounds give [-beta_max, beta_max]; infinite = unbounded side. */
  readonly low: number;
  readonly high: number;
  readonly symmetric: boolean;
  readonly cautions: readonly string[];
}

function resolveInterval(field: string, max: number | undefined, interval: readonly [number | null, number | null] | undefined) {
  if ((max === undefined) === (interval === undefined)) {
    throw new PhysicsInputError(field, `give exactly one of ${field} and interval`);
  }
  if (max !== undefined) {
    requireFinite(field, max);
    if (max <= 0) throw new PhysicsInputError(field, `${field} must be positive`);
    return { low: -max, high: max, symmetric: true };
  }
  const [lo, hi] = interval!;
  if (lo === null && hi === null) throw new PhysicsInputError("interval", "a one-sided bound needs its finite side");
  const low = lo === null ? -Infinity : requireFinite("interval.0", lo);
  const high = hi === null ? Infinity : requireFinite("interval.1", hi);
  if (!(low < high)) throw new PhysicsInputError("interval", "interval must satisfy low < high");
  if (low > 0 || high < 0) throw new PhysicsInputError("interval", "GR itself is outside the interval: it excludes 0");
  return { low, high, symmetric: false };
}

/** Multiplies [low, high] by a factor, keeping the order (a negative factor swaps the ends). */
function scaleInterval(low: number, high: number, factor: number): [number, number] {
  const times = (x: number) => (x === 0 ? 0 : x * factor);
  const a = times(low);
  const c = times(high);
  return [Math.min(a, c), Math.max(a, c)];
}

/** LaTeX of the deviation each channel bounds. */
const DEVIATION_LATEX: Record<MappingChannel, string> = {
  phase: "\\beta",
  amplitude: "\\alpha",
};

function resolveBound(bound: BoundInput, binary: Binary): ResolvedBound | NoConstraintResult {
  if (bound.kind === "amplitude") {
    // No degenerate exponent and no sign convention: exp(-i Psi) does not touch the amplitude.
    const a = requireFinite("a", bound.a);
    const r = resolveInterval("alpha_max", bound.alpha_max, bound.interval);
    return { b: a, channel: "amplitude", symbol: DEVIATION_LATEX.amplitude, low: r.low, high: r.high, symmetric: r.symmetric, cautions: [] };
  }
  if (bound.kind === "ppe") {
    const b = requireFinite("b", bound.b);
    const degenerate = degeneracyOfB(b);
    if (degenerate) return noConstraint("degenerate_b", degenerate);
    const r = resolveInterval("beta_max", bound.beta_max, bound.interval);
    const convention = bound.convention ?? "plus";
    const [low, high] = scaleInterval(r.low, r.high, normaliseSign(1, convention));
    return { b, channel: "phase", symbol: DEVIATION_LATEX.phase, low, high, symmetric: r.symmetric, cautions: [] };
  }
  const f = gimrFactor(bound.k, binary.eta, {
    includesSpin: bound.includes_spin ?? false,
    spins: { eta: binary.eta, dm: binary.dm, chi_s: binary.chi_s, chi_a: binary.chi_a, bodies: binary.bodies },
  });
  if (f.status !== "ok") return noConstraint(f.status === "degenerate" ? "degenerate_b" : "no_ppe_equivalent", f.reason);
  const r = resolveInterval("dphi_max", bound.dphi_max, bound.interval);
  const [low, high] = scaleInterval(r.low, r.high, f.factor);
  return { b: f.b, channel: "phase", symbol: DEVIATION_LATEX.phase, low, high, symmetric: r.symmetric, cautions: f.cautions };
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
  const channel = mapping.channel ?? "phase";
  if (resolved.channel !== channel) {
    throw new PhysicsInputError("parameter", `the bound is on the ${resolved.channel} but this mapping gives the ${channel}`);
  }
  if (Math.abs(resolved.b - mapping.b) > 1e-12) {
    const letter = channel === "amplitude" ? "a" : "b";
    throw new PhysicsInputError(letter, `the bound is at ${letter} = ${resolved.b} but this mapping enters at ${letter} = ${mapping.b}`);
  }
  const dev = resolved.symbol;
  // The deviation in plain text for the sentences below.
  const word = resolved.channel === "phase" ? "β" : "α";
  const sym = resolved.channel === "phase" ? "β" : "α";
  const warnings: string[] = [];
  const cautions: string[] = [...resolved.cautions, ...(mapping.cautions ?? [])];
  if (mapping.onlyFor) {
    const outside = binary.bodies.filter((k) => !mapping.onlyFor!.bodies.includes(k));
    if (outside.length > 0) {
      return noConstraint(
        "bodies_not_covered",
        `the mapping holds only for ${mapping.onlyFor.bodies.join("/")} bodies (${mapping.onlyFor.description}); this binary is ${binary.bodies.join("-")}`,
        warnings,
        cautions,
      );
    }
  }
  const env = context.envFor(mapping);
  for (const s of mapping.requires ?? []) {
    if (env[s] === undefined) {
      throw new PhysicsInputError(fieldOfSymbol(s), `this mapping needs ${conditionText(s)}, which the binary does not provide`);
    }
  }
  if (mapping.derivedFor) {
    const others = binary.bodies.filter((k) => !mapping.derivedFor!.includes(k));
    if (others.length > 0) cautions.push(`the mapping was derived for ${mapping.derivedFor.join("/")} bodies; this binary has ${binary.bodies.join("-")}`);
  }

  const F = mapping.bind ? mapping.bind(env) : (x: number) => mapping.evaluate(x, env);
  const range = mapping.coupling.range ?? "positive";
  const { low, high } = resolved;
  const betaInterval: [number | null, number | null] = [Number.isFinite(low) ? low : null, Number.isFinite(high) ? high : null];

  // The sign of beta over the coupling's physical range, by evaluation (spins and masses can change it).
  const probeValues = SIGN_PROBES.map(F);
  const negativeValues = range === "any_sign" ? SIGN_PROBES.map((p) => F(-p)) : [];
  const all = [...probeValues, ...negativeValues];
  if (all.some(Number.isNaN)) {
    throw new PhysicsInputError(mapping.coupling.symbol, "the mapping does not evaluate to a number for this binary");
  }
  if (all.every((v) => v === 0)) {
    return noConstraint(
      "vanishing_mapping",
      `${word} vanishes for this binary at every coupling (e.g. equal masses and spins emit no scalar dipole): this binary constrains nothing`,
      warnings,
      cautions,
    );
  }
  const theorySign: -1 | 0 | 1 = all.every((v) => v >= 0) ? 1 : all.every((v) => v <= 0) ? -1 : 0;
  const twoSided = theorySign === 0 && range === "any_sign";

  // Which |beta| bounds the magnitude of the coupling, and which end of the interval that is.
  let betaMax: number;
  let sideUsed: "lower" | "upper" | "both";
  if (theorySign === -1) {
    betaMax = -low;
    sideUsed = "lower";
  } else if (theorySign === 1) {
    betaMax = high;
    sideUsed = "upper";
  } else {
    betaMax = Math.max(-low, high);
    sideUsed = "both";
    if (!twoSided) warnings.push(`${word} changes sign with the coupling: the wider side of the interval is used (conservative)`);
  }
  if (theorySign !== 0 && !Number.isFinite(betaMax)) {
    const predicted = theorySign < 0 ? `${sym} < 0` : `${sym} > 0`;
    const missing = theorySign < 0 ? "lower end" : "upper end";
    return noConstraint(
      "unreachable_side",
      `this theory gives ${predicted} for this binary, and the bound has no ${missing}: the side the theory can reach is unbounded, so it says nothing about the coupling`,
      warnings,
      cautions,
    );
  }
  if (betaMax === 0) {
    return noConstraint(
      "unreachable_side",
      `the interval ends at ${sym} = 0 on the side this theory reaches: taken literally it leaves no room for any non-GR coupling; state the bound with its credible width on that side`,
      warnings,
      cautions,
    );
  }
  if (!twoSided && !Number.isFinite(betaMax)) {
    return noConstraint("unreachable_side", `${sym} takes both signs as the coupling varies and the bound is one-sided: no limit follows`, warnings, cautions);
  }

  // Signed interval for a coupling of either sign: each finite end of [low, high] maps to the coupling
  // value on the side of zero where beta has that end's sign.
  let signed: SignedInterval | null = null;
  let signedEnds: { lower: { x: number; beta: number } | null; upper: { x: number; beta: number } | null } | null = null;
  if (twoSided) {
    const sideOf = (betaSign: 1 | -1): 1 | -1 => ((probeValues[2]! > 0 ? 1 : -1) === betaSign ? 1 : -1);
    const solveEnd = (beta: number): { x: number; beta: number } | null => {
      if (!Number.isFinite(beta)) return null;
      if (beta === 0) return { x: 0, beta: 0 };
      const s = sideOf(beta > 0 ? 1 : -1);
      const [lo, hi] = mapping.domain ?? [1e-60, 1e60];
      const root = solveMagnitude((t) => F(s * t), Math.abs(beta), lo, hi);
      if (root.kind === "none") return null;
      return { x: s * root.x, beta };
    };
    const atLow = solveEnd(low);
    const atHigh = solveEnd(high);
    // The end of [low, high] whose coupling is negative gives the signed interval's lower end.
    const lowIsNegative = sideOf(-1) === -1;
    signedEnds = lowIsNegative ? { lower: atLow, upper: atHigh } : { lower: atHigh, upper: atLow };
    const q = signedQuantity(mapping.coupling);
    signed = {
      symbol: q.symbol,
      latex: q.latex,
      unit: q.unit,
      lower: signedEnds.lower === null ? null : q.value(signedEnds.lower.x),
      upper: signedEnds.upper === null ? null : q.value(signedEnds.upper.x),
    };
  }

  // A coupling of either sign bounded on one side only: the headline is that signed end.
  if (twoSided && !Number.isFinite(betaMax)) {
    const end = signedEnds!.lower ?? signedEnds!.upper;
    if (!end || end.x === 0) {
      return noConstraint("unreachable_side", "the finite end of this one-sided bound does not constrain the coupling for this binary", warnings, cautions);
    }
    const endIsUpper = signedEnds!.lower === null;
    const q = signedQuantity(mapping.coupling);
    const validity = evaluateValidity(mapping, end.x, env, binary);
    const { verdict, failing } = verdictOf(validity);
    const spec = mapping.coupling;
    const side: Side = endIsUpper ? "upper" : "lower";
    const quoted: QuotedValue = { symbol: q.symbol, latex: q.latex, value: q.value(end.x), unit: q.unit, side };
    const rel = endIsUpper ? "\\le" : "\\ge";
    return {
      status: "bounded",
      side,
      coupling: { symbol: spec.symbol, latex: spec.latex, value: end.x, unit: spec.unit },
      quoted,
      extras: [],
      conventions: [],
      method: "numeric_root",
      latex: `${dev}(${spec.latex}) = ${formatLatexNumber(end.beta)} \\;\\Rightarrow\\; ${q.latex} ${rel} ${formatLatexNumber(quoted.value)}${q.unit && q.unit !== "1" ? `\\,${unitLatex(q.unit)}` : ""}`,
      b: mapping.b,
      beta_max: Math.abs(end.beta),
      theory_sign: 0,
      beta_interval: betaInterval,
      side_used: end.beta === low ? "lower" : "upper",
      signed_interval: signed,
      signed_headline: true,
      beta_at_limit: F(end.x),
      validity,
      verdict,
      failing,
      valid: verdict === "valid",
      warnings,
      cautions,
    };
  }

  let x: number;
  /** Where validity and beta are evaluated: the limit, or for an asymmetric signed coupling the wider end itself. */
  let at: number | undefined;
  let side: Side;
  let method: "closed_form" | "numeric_root" = "numeric_root";
  let power: number | undefined;
  let prefactor: number | undefined;
  const law = detectPowerLaw(F);
  if (law && law.power === 0) {
    return noConstraint("coupling_independent", `${word} does not depend on the coupling for this binary`, warnings, cautions);
  }
  // A coupling of either sign whose mapping is not odd (F(-x) != -F(x): a distance ratio, 1/r - 1) maps
  // the two ends of the interval to couplings of different sizes: the magnitude bound is the larger of
  // the two ends of the signed interval, not the root on the positive side of the wider end.
  const asymmetric = twoSided && signedEnds?.lower && signedEnds.upper && Math.abs(F(1) + F(-1)) > 1e-9 * Math.max(Math.abs(F(1)), Math.abs(F(-1)));
  if (asymmetric) {
    const ends = [signedEnds!.lower!, signedEnds!.upper!];
    const widest = ends.reduce((w, e) => (Math.abs(e.x) > Math.abs(w.x) ? e : w));
    x = Math.abs(widest.x);
    at = widest.x;
    side = "upper";
    betaMax = Math.abs(widest.beta);
  } else if (law && law.prefactor > 0) {
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
  if (method === "numeric_root" && !asymmetric) {
    const [lo, hi] = mapping.domain ?? [1e-60, 1e60];
    const root = solveMagnitude(F, betaMax, lo, hi);
    if (root.kind === "none") return noConstraint("out_of_range", root.reason, warnings, cautions);
    x = root.x;
    side = root.side;
    if (!root.monotonic) {
      warnings.push(
        `|β| is not monotonic in ${symbolText(mapping.coupling.symbol, mapping.coupling.latex)}: the limit is the edge of the allowed region that contains GR; further allowed intervals may exist`,
      );
    }
  }

  // An asymmetric signed interval: a condition may depend on the sign, so each is taken at the end where it is worst.
  const validity = asymmetric
    ? worstOf(evaluateValidity(mapping, signedEnds!.lower!.x, env, binary), evaluateValidity(mapping, signedEnds!.upper!.x, env, binary))
    : evaluateValidity(mapping, at ?? x!, env, binary);
  const { verdict, failing } = verdictOf(validity);

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
    latex: limitLatex(spec, side!, x!, betaMax, presented.primary, method, power, prefactor, dev),
    b: mapping.b,
    beta_max: betaMax,
    theory_sign: theorySign,
    beta_interval: betaInterval,
    side_used: sideUsed,
    signed_interval: signed,
    signed_headline: false,
    beta_at_limit: F(at ?? x!),
    validity,
    verdict,
    failing,
    valid: verdict === "valid",
    warnings,
    cautions,
  };
}

/**
 * The signed quantity a coupling of either sign is reported in: its quoted form carrying the sign
 * (Gdot/G in 1/yr, eps3), or for a dispersion length, whose sign is the sign of A, the amplitude A
 * itself (|A| = (h c / lambda_A)^(2 - alpha)), which is linear in beta.
 */
export function signedQuantity(spec: CouplingSpec): { symbol: string; latex: string; unit: string; value: (x: number) => number } {
  const q = spec.quoted;
  const sign = (x: number) => (x < 0 ? -1 : 1);
  if (q.form === "dispersion_length") {
    const extra = presentLimit(1, "upper", q).extras[0]!;
    return {
      symbol: "A",
      latex: "A",
      unit: extra.unit,
      value: (x) => (x === 0 ? 0 : sign(x) * presentLimit(Math.abs(x), "upper", q).extras[0]!.value),
    };
  }
  return {
    symbol: q.symbol,
    latex: stripAbsoluteBars(q.latex),
    unit: q.unit,
    value: (x) => (x === 0 ? 0 : sign(x) * presentLimit(Math.abs(x), "upper", q).primary.value),
  };
}

/** "|\\dot G/G|" -> "\\dot G/G": the quoted symbol of a magnitude, as the signed quantity. */
export function stripAbsoluteBars(latex: string): string {
  const t = latex.trim();
  return t.startsWith("|") && t.endsWith("|") && t.length > 2 ? t.slice(1, -1) : t;
}

function evaluateValidity(mapping: MappingSpec, x: number, env: Env, binary: Binary): ValidityResult[] {
  const out: ValidityResult[] = [];
  for (const c of mapping.validity ?? []) {
    if (c.body && c.appliesTo && !c.appliesTo.includes(binary.bodies[c.body - 1]!)) continue;
    out.push(judgeCondition(c, c.evaluate(x, env)));
  }
  return out;
}

/** Condition by condition, the evaluation with the larger value (both lists come from the same conditions, in order). */
function worstOf(a: readonly ValidityResult[], b: readonly ValidityResult[]): ValidityResult[] {
  return a.map((v, i) => {
    const w = b[i];
    if (!w) return v;
    if (!Number.isFinite(v.value)) return v;
    if (!Number.isFinite(w.value)) return w;
    return w.value > v.value ? w : v;
  });
}

export { verdictOf };

function limitLatex(
  spec: CouplingSpec,
  side: Side,
  x: number,
  betaMax: number,
  quoted: QuotedValue,
  method: "closed_form" | "numeric_root",
  power: number | undefined,
  prefactor: number | undefined,
  dev = "\\beta",
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
      `{${spec.latex}}_{${sub}} = \\left(\\frac{${dev}_{\\max}}{|${dev}(${one})|}\\right)${raise}` +
      ` = \\left(\\frac{${formatLatexNumber(betaMax)}}{${formatLatexNumber(prefactor)}}\\right)${raise}` +
      ` = ${formatLatexNumber(x)}${unitSpace}, \\qquad ${quotedPart}`
    );
  }
  return `|${dev}(${spec.latex})| = ${formatLatexNumber(betaMax)} \\;\\Rightarrow\\; {${spec.latex}}_{${sub}} = ${formatLatexNumber(x)}${unitSpace}, \\qquad ${quotedPart}`;
}
