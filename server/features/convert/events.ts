import type { EventsRequest, EventsResponse } from "../../../common/convert-samples.ts";
import type { BoundRequest, Caution } from "../../../common/convert.ts";
import { ValidationError } from "../../errors.ts";
import { detectPowerLaw } from "../../physics/invert.ts";
import { quotedValueOf } from "../../physics/quoted-forms.ts";
import type { CompiledCatalogue } from "./compiled-catalogue.ts";
import { mappingCautions, selectTarget } from "./samples-common.ts";
import { prepareBinary, translateBound, type Prepared } from "./translate.ts";

/**
 * Several events, one theory: each event's bound is translated at its own binary (exactly as
 * POST /convert does), and the events are combined at the level of the coupling, never by combining
 * beta (each event maps the same coupling to a different beta).
 *
 * Combined limit, under a Gaussian approximation of each event's bound: event i's |beta| is read as
 * half-normal with zero mean and sigma_i = U_i / q (U_i its bound, q the half-normal quantile of the
 * credibility); with beta_i = K_i x^p and a flat prior in y = x^p >= 0, the product of the likelihoods
 * exp(-(K_i y)^2 / (2 sigma_i^2)) is a half-normal in y with 1/sigma_y^2 = sum K_i^2 / sigma_i^2. Its
 * credibility quantile is y_c = q sigma_y, so q cancels: y_c = (sum (K_i / U_i)^2)^(-1/2), and
 * x_c = y_c^(1/p). One event gives back its own /convert limit; N identical events scale x_c by
 * N^(-1/(2p)).
 */

export const COMBINATION_RULE =
  "Combined under a Gaussian approximation of each event's bound: each |beta_i| is read as a zero-mean half-normal with sigma_i = U_i / q, " +
  "the likelihoods exp(-(K_i y)^2 / 2 sigma_i^2) are multiplied with a flat prior in y = x^p, and the limit is the credibility quantile: " +
  "y_c = (Σ (K_i / U_i)^2)^(-1/2), x_c = y_c^(1/p).";

function eventBound(request: EventsRequest, upper: number): BoundRequest {
  return request.parameter === "ppe_beta"
    ? { parameter: "ppe_beta", b: request.b!, upper, credibility: request.credibility, sign_convention: request.sign_convention }
    : { parameter: "gimr_dphi", k: request.k!, upper, credibility: request.credibility, includes_spin: request.includes_spin };
}

function prepareEvent(index: number, binary: EventsRequest["events"][number]["binary"], cosmology: EventsRequest["cosmology"]): Prepared {
  try {
    return prepareBinary(binary, cosmology);
  } catch (err) {
    if (err instanceof ValidationError && err.fields) {
      const fields = Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [k.startsWith("binary.") ? `events.${index}.${k}` : k, v]));
      const first = Object.keys(fields)[0] ?? `events.${index}`;
      throw new ValidationError(`Invalid ${first}: ${err.message}`, fields);
    }
    throw err;
  }
}

export function convertEvents(catalogue: CompiledCatalogue, request: EventsRequest): EventsResponse {
  const target = selectTarget(catalogue, request);
  const mapping = target.ready.compiled;
  const quoted = mapping.coupling.quoted;
  let power: number | null = null;
  const rows: EventsResponse["events"] = [];
  const usable: { label: string; k: number; u: number; limit: number }[] = [];

  request.events.forEach((event, index) => {
    const prepared = prepareEvent(index, event.binary, request.cosmology);
    const answer = translateBound(catalogue, prepared, eventBound(request, event.upper), { theories: [target.theory.theory.slug] });
    const result = answer.results[0];
    if (!result) {
      const na = answer.not_applicable[0];
      rows.push({ label: event.label, limit: null, valid: null, beta_max: answer.bound.beta_max, prefactor: null, reason: na?.reason ?? "no limit for this event" });
      return;
    }
    const F = mapping.bind ? mapping.bind(prepared.context.envFor(mapping)) : (x: number) => mapping.evaluate(x, prepared.context.envFor(mapping));
    const law = detectPowerLaw(F);
    const limit = result.coupling.value;
    rows.push({ label: event.label, limit, valid: result.valid, beta_max: result.beta_max, prefactor: law?.prefactor ?? null, reason: null });
    if (law) {
      power = law.power;
      usable.push({ label: event.label, k: law.prefactor, u: result.beta_max, limit });
    }
  });

  const p = power as number | null;
  // Without a power law (no usable event) the side cannot be told from p; upper is the common case.
  const side = p !== null && p < 0 ? "lower" : "upper";
  const limited = rows.flatMap((r) => (r.limit === null ? [] : [{ label: r.label, limit: r.limit }]));
  const tightest = limited.reduce<{ label: string; limit: number } | null>((best, r) => {
    if (!best) return r;
    return (side === "upper" ? r.limit < best.limit : r.limit > best.limit) ? r : best;
  }, null);

  let combined: EventsResponse["combined"] = null;
  if (p !== null && usable.length > 0) {
    const yC = 1 / Math.sqrt(usable.reduce((s, e) => s + (e.k / e.u) ** 2, 0));
    combined = { limit: quotedValueOf(quoted.form, yC ** (1 / p)), events_used: usable.length, rule: COMBINATION_RULE };
  }

  const cautions: Caution[] = [
    {
      code: "prior",
      message:
        "The combined limit reads each event's bound as a Gaussian (half-normal) constraint and assumes a flat prior in x^p; with the events' posterior samples, translate each one sample by sample instead.",
    },
    ...mappingCautions(target),
  ];
  if (rows.some((r) => r.valid === false)) cautions.push({ code: "validity", message: "Some events' limits fail a hard validity condition: see the per-event rows." });
  const skipped = rows.filter((r) => r.limit === null).length;
  if (skipped > 0) cautions.push({ code: "engine", message: `${skipped} event(s) give no limit for this theory and are left out of the combination.` });

  return {
    theory: target.theory.theory.slug,
    theory_name: target.theory.theory.name,
    b: target.b,
    credibility: request.credibility,
    coupling: { symbol: quoted.symbol, latex: quoted.latex, unit: quoted.unit, side },
    power: p,
    events: rows,
    tightest,
    combined,
    cautions,
  };
}
