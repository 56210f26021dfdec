import type { EventsRequest, EventsResponse } from "../../../common/convert-samples.ts";
import { symbolText } from "../../../common/symbol-text.ts";
import type { Caution, ConvertBoundRequest, ConvertResult } from "../../../common/convert.ts";
import { ValidationError } from "../../errors.ts";
import { detectPowerLaw, solveMagnitude } from "../../physics/invert.ts";
import { quotedValueOf } from "../../physics/quoted-forms.ts";
import type { CompiledCatalogue } from "./compiled-catalogue.ts";
import { mappingCautions, selectTarget, type Target } from "./samples-common.ts";
import { prepareBinary, translateBound, type Prepared } from "./translate.ts";

/**
 * Several events, one coupling: each event's bound is translated at its own binary (exactly as
 * POST /convert does), and the events are combined at the level of the coupling, never by combining
 * beta (each event maps the same coupling to a different beta).
 *
 * Combined limit, under a Gaussian approximation of each event's bound: event i's |beta| on the side
 * the theory reaches is read as half-normal with zero mean and sigma_i = U_i / q (U_i that side's
 * bound, q the half-normal quantile of the credibility). When every event's mapping has the same shape,
 * |beta_i| = K_i g(x) (a power law x^p is one case; Brans-Dicke's 1/(2 + omega) another), a flat prior
 * in y = g(x) >= 0 makes the product of the likelihoods a half-normal in y with
 * 1/sigma_y^2 = sum K_i^2 / sigma_i^2. Its credibility quantile is y_c = q sigma_y, so q cancels:
 * y_c = (sum (K_i / U_i)^2)^(-1/2), and the combined limit solves g(x) = y_c. It is an upper limit
 * when g grows away from GR (alpha, Gdot/G) and a lower limit when GR sits at infinity (lambda_g,
 * omega_BD): "tightest" and the combination follow the side, never assuming upper bounds.
 * Events whose limit is outside validity stay out of the combination (and are named).
 */

export const COMBINATION_RULE =
  "Combined under a Gaussian approximation of each event's bound: each |beta_i| = K_i g(x) on the side the theory reaches is read as a zero-mean half-normal " +
  "with sigma_i = U_i / q, the likelihoods are multiplied with a flat prior in y = g(x), and the limit is the credibility quantile: y_c = (Σ (K_i / U_i)^2)^(-1/2), solved for x. " +
  "For a lower limit (GR at infinity, e.g. lambda_g or omega_BD) the combined limit is the larger value. Events outside validity are left out.";

function eventBound(request: EventsRequest, event: EventsRequest["events"][number]): ConvertBoundRequest {
  const value = {
    ...(event.upper !== undefined ? { upper: event.upper } : {}),
    ...(event.interval !== undefined ? { interval: event.interval } : {}),
    credibility: request.credibility,
    f_low: request.f_low,
  };
  if (request.parameter === "ppe_alpha") return { parameter: "ppe_alpha", a: request.a!, ...value };
  return request.parameter === "ppe_beta"
    ? { parameter: "ppe_beta", b: request.b!, ...value, sign_convention: request.sign_convention }
    : { parameter: "gimr_dphi", k: request.k!, ...value, includes_spin: request.includes_spin };
}

function prepareEvent(index: number, binary: EventsRequest["events"][number]["binary"], request: EventsRequest): Prepared {
  try {
    return prepareBinary(binary, request.cosmology, request.f_low);
  } catch (err) {
    if (err instanceof ValidationError && err.fields) {
      const fields = Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [k.startsWith("binary.") ? `events.${index}.${k}` : k, v]));
      const first = Object.keys(fields)[0] ?? `events.${index}`;
      throw new ValidationError(`Invalid ${first}: ${err.message}`, fields);
    }
    throw err;
  }
}

/** True when the tighter of two limits on the side is `a`: smaller for an upper limit, larger for a lower one. */
export function isTighter(side: "upper" | "lower", a: number, b: number): boolean {
  return side === "upper" ? a < b : a > b;
}

interface Usable {
  label: string;
  F: (x: number) => number;
  u: number;
  /** The event's own limit on the canonical coupling. */
  x: number;
}

/** The theory's amplitude mapping at a (one coupling, or the one named): the amplitude twin of selectTarget. */
function selectAmplitudeTarget(catalogue: CompiledCatalogue, request: EventsRequest, a: number): Target {
  const theory = catalogue.bySlug.get(request.theory);
  if (!theory) {
    const known = [...catalogue.bySlug.keys()].sort().join(", ");
    throw new ValidationError(`Invalid theory: unknown theory "${request.theory}"`, { theory: `unknown theory "${request.theory}"; accepted theories are ${known}` });
  }
  const atA = theory.amplitude.filter((m) => Math.abs(m.compiled.b - a) < 1e-9);
  if (atA.length === 0) {
    const message = `${theory.theory.name} has no amplitude mapping at a = ${a} (its amplitude mappings enter at a = ${theory.as.join(", ") || "none"})`;
    throw new ValidationError(`Invalid a: ${message}`, { a: message });
  }
  const symbols = atA.map((m) => m.compiled.coupling.symbol);
  const chosen = request.coupling === undefined ? (atA.length === 1 ? atA[0] : undefined) : atA.find((m) => m.compiled.coupling.symbol === request.coupling);
  if (!chosen) {
    const message =
      request.coupling === undefined
        ? `${theory.theory.name} has ${atA.length} couplings at a = ${a} (${symbols.join(", ")}): name one in coupling`
        : `${theory.theory.name} has no coupling "${request.coupling}" at a = ${a}; its couplings there are ${symbols.join(", ")}`;
    throw new ValidationError(`Invalid coupling: ${message}`, { coupling: message });
  }
  return { theory, ready: chosen, b: a };
}

export function convertEvents(catalogue: CompiledCatalogue, request: EventsRequest): EventsResponse {
  const amplitude = request.parameter === "ppe_alpha";
  const target = request.parameter === "ppe_alpha" ? selectAmplitudeTarget(catalogue, request, request.a!) : selectTarget(catalogue, { ...request, parameter: request.parameter });
  const mapping = target.ready.compiled;
  const symbol = mapping.coupling.symbol;
  const quoted = mapping.coupling.quoted;
  let power: number | null = null;
  let side: "upper" | "lower" | null = null;
  const rows: EventsResponse["events"] = [];
  const usable: Usable[] = [];
  const outside: string[] = [];
  const oneSided: string[] = [];

  request.events.forEach((event, index) => {
    const prepared = prepareEvent(index, event.binary, request);
    const answer = translateBound(catalogue, prepared, eventBound(request, event), { theories: [target.theory.theory.slug] });
    const result: ConvertResult | undefined = answer.results.find((r) => r.coupling_symbol === symbol);
    if (!result) {
      const na = answer.not_applicable.find((n) => n.reason.startsWith(`${symbolText(symbol, mapping.coupling.latex)}:`)) ?? answer.not_applicable[0];
      rows.push({ label: event.label, limit: null, valid: null, verdict: null, combined: false, beta_max: answer.bound.beta_max, prefactor: null, reason: na?.reason ?? "no limit for this event" });
      return;
    }
    const env = prepared.context.envFor(mapping);
    const F = mapping.bind ? mapping.bind(env) : (x: number) => mapping.evaluate(x, env);
    const law = detectPowerLaw(F);
    const limit = result.coupling.value;
    // A one-sided bound on a coupling of either sign gives one end of a signed interval, not a magnitude limit.
    const signedEnd = result.signed_interval !== null && (result.signed_interval.lower === null || result.signed_interval.upper === null);
    if (!signedEnd) side ??= result.coupling.side;
    let combined = false;
    if (result.verdict === "outside_validity") outside.push(event.label);
    else if (signedEnd) oneSided.push(event.label);
    else {
      if (law) power = law.power;
      usable.push({ label: event.label, F, u: result.beta_max, x: result.canonical.value });
      combined = true;
    }
    rows.push({ label: event.label, limit, valid: result.valid, verdict: result.verdict, combined, beta_max: result.beta_max, prefactor: law?.prefactor ?? null, reason: null });
  });

  const finalSide: "upper" | "lower" = side ?? "upper";
  const limited = rows.flatMap((r) => (r.limit === null ? [] : [{ label: r.label, limit: r.limit }]));
  const tightest = limited.reduce<{ label: string; limit: number } | null>((best, r) => (!best || isTighter(finalSide, r.limit, best.limit) ? r : best), null);

  const cautions: Caution[] = [
    {
      code: "prior",
      message:
        "The combined limit reads each event's bound as a Gaussian (half-normal) constraint and assumes a flat prior in the shape g(x) of beta = K g(x); with the events' posterior samples, translate each one sample by sample instead.",
    },
    ...mappingCautions(target),
    ...(amplitude
      ? [
          {
            code: "amplitude" as const,
            message: `Each event's bound is on the ppE amplitude α at a = ${target.b}: the rule below reads beta as α, and the theory's phase terms are left out.`,
          },
        ]
      : []),
  ];

  let combined: EventsResponse["combined"] = null;
  const first = usable[0];
  if (first) {
    // The same shape for every event: |F_i(x)| / |F_i(x0)| must agree at a few probes around x0.
    const x0 = first.x;
    const K = (u: Usable) => Math.abs(u.F(x0));
    const probes = [x0 / 100, x0 / 10, x0 * 10, x0 * 100];
    const sameShape = usable.every((u) =>
      probes.every((x) => {
        const a = Math.abs(u.F(x)) / K(u);
        const b = Math.abs(first.F(x)) / K(first);
        return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
      }),
    );
    if (sameShape && usable.every((u) => K(u) > 0 && Number.isFinite(K(u)))) {
      const yC = 1 / Math.sqrt(usable.reduce((s, u) => s + (K(u) / u.u) ** 2, 0));
      const root = solveMagnitude(first.F, K(first) * yC);
      if (root.kind === "root") {
        combined = { limit: quotedValueOf(quoted.form, root.x), events_used: usable.length, rule: COMBINATION_RULE };
      }
    } else {
      cautions.push({ code: "engine", message: "The events' mappings differ in shape (beta is not K_i times one function of the coupling), so no combined limit is given: see each event's own limit." });
    }
  }

  if (outside.length > 0) {
    cautions.push({ code: "validity", message: `Left out of the combination because their limits are outside validity: ${outside.join(", ")}.` });
  }
  if (oneSided.length > 0) {
    cautions.push({ code: "engine", message: `Left out of the combination because their one-sided bounds do not bound the coupling's magnitude: ${oneSided.join(", ")}.` });
  }
  const skipped = rows.filter((r) => r.limit === null).length;
  if (skipped > 0) cautions.push({ code: "engine", message: `${skipped} event(s) give no limit for this theory and are left out of the combination.` });

  return {
    theory: target.theory.theory.slug,
    theory_name: target.theory.theory.name,
    channel: amplitude ? "amplitude" : "phase",
    b: target.b,
    credibility: request.credibility,
    coupling: { symbol: quoted.symbol, latex: quoted.latex, unit: quoted.unit, side: finalSide },
    power: power as number | null,
    events: rows,
    tightest,
    combined,
    cautions,
  };
}
