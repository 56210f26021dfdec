import { convertRequestSchema } from "../../../common/convert.ts";
import type { ForecastRequest, ForecastResponse, ForecastTranslationDto } from "../../../common/forecasts.ts";
import { ValidationError } from "../../errors.ts";
import { parseWith } from "../../http/route.ts";
import { DEFAULT_PRIORS, runForecast, type CustomCurveData, type ForecastResult, type PriorWidths } from "../../physics/forecast/forecast.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";
import { translate } from "../convert/translate.ts";

/**
 * One forecast from a validated request to the API's answer: the Fisher computation and the
 * translation of each network's bound into every catalogued theory. Synchronous and pure given the
 * compiled catalogue, so it runs where the heavy work belongs: the forecast worker thread for a
 * single forecast, the job worker for a grid. Never on the web process's event loop.
 */

export function resolvePriors(p: ForecastRequest["priors"]): PriorWidths {
  return {
    phi_c: p?.phi_c === undefined ? DEFAULT_PRIORS.phi_c : p.phi_c,
    chi_s: p?.chi_s === undefined ? DEFAULT_PRIORS.chi_s : p.chi_s,
    chi_a: p?.chi_a === undefined ? DEFAULT_PRIORS.chi_a : p.chi_a,
  };
}

/** A PhysicsInputError (field named) as the 400 the routes answer. */
export function asValidation<T>(fn: () => T, rename: (field: string) => string = (f) => f): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof PhysicsInputError) {
      const field = rename(err.field);
      const message = err.message.startsWith(err.field) ? field + err.message.slice(err.field.length) : err.message;
      const text = message.startsWith(field) ? message : `${field}: ${message}`;
      throw new ValidationError(`Invalid request body: ${text}`, { [field]: message });
    }
    throw err;
  }
}

/** The b values each catalogued theory's phase mappings enter at, within the forecast's range. */
export function theoryExponents(catalogue: CompiledCatalogue | null): number[] {
  if (!catalogue) return [];
  return [...new Set(catalogue.theories.flatMap((t) => t.bs))].filter((b) => Number.isFinite(b) && b >= -20 && b <= 10).sort((x, y) => x - y);
}

export function translateForecast(catalogue: CompiledCatalogue, request: Pick<ForecastRequest, "sides" | "credibility">, result: ForecastResult, theoryBs: readonly number[]): ForecastTranslationDto[] {
  const out: ForecastTranslationDto[] = [];
  for (const [ni, network] of result.networks.entries()) {
    for (const b of theoryBs) {
      const row = network.rows.find((r) => r.b === b);
      if (!row || row.bound === null) continue;
      // Two-sided: |beta| < B. One-sided: the sign is the theory's, so both one-sided intervals are
      // translated and each theory keeps the side its beta lives on (the translator says which).
      const intervals: [number | null, number | null][] = request.sides === "two" ? [[-row.bound, row.bound]] : [[-row.bound, null], [null, row.bound]];
      const answers = intervals.map((interval) => {
        const bound =
          request.sides === "two"
            ? { parameter: "ppe_beta", b, upper: row.bound, credibility: request.credibility }
            : { parameter: "ppe_beta", b, interval, credibility: request.credibility };
        const convertRequest = parseWith(
          convertRequestSchema,
          {
            bound,
            binary: { m1: result.source.m1, m2: result.source.m2, chi1: result.source.chi1, chi2: result.source.chi2, frame: "source", z: result.source.z },
            cosmology: result.cosmology,
          },
          "translation request",
        );
        return { interval, answer: translate(catalogue, convertRequest) };
      });
      const translatedTheories = new Set(answers.flatMap((a) => a.answer.results.map((r) => r.theory)));
      for (const { interval, answer } of answers) {
        out.push({
          network: ni,
          b,
          beta_max: row.bound,
          sides: request.sides,
          interval,
          results: answer.results,
          // A theory limited by the other one-sided interval is not "not applicable".
          not_applicable: answer.not_applicable.filter((n) => n.code !== "different_b" && !translatedTheories.has(n.theory)),
          cautions: answer.cautions,
        });
      }
      if (request.sides === "one" && answers.length === 2) {
        // the same non-applicable theory would otherwise be listed once per side
        const last = out[out.length - 1]!;
        const first = out[out.length - 2]!;
        const seen = new Set(first.not_applicable.map((n) => n.theory));
        last.not_applicable = last.not_applicable.filter((n) => !seen.has(n.theory));
      }
    }
  }
  return out;
}

/** Everything a forecast request asks for, without its source (a grid varies the source). */
export type ForecastSettings = Omit<ForecastRequest, "source">;

/**
 * The full answer for one source. The theories' b values are always computed (they are needed for the
 * translation) and then dropped from the rows unless they were asked for.
 */
export function forecastWithTranslations(
  request: ForecastSettings & { source: ForecastRequest["source"] },
  curves: readonly CustomCurveData[],
  catalogue: CompiledCatalogue | null,
  rename?: (field: string) => string,
): ForecastResponse {
  const theoryBs = request.translate ? theoryExponents(catalogue) : [];
  const bs = [...new Set([...request.b, ...theoryBs])];
  const result = asValidation(
    () =>
      runForecast(
        {
          source: request.source,
          ...(request.cosmology ? { cosmology: request.cosmology } : {}),
          detectors: request.detectors,
          networks: request.networks,
          b: bs,
          priors: resolvePriors(request.priors),
          credibility: request.credibility,
          sides: request.sides,
          upper_cut: request.upper_cut,
          coalescence: request.coalescence,
          include_matrices: request.include_matrices,
        },
        [...curves],
      ),
    rename,
  );
  const translated = catalogue && request.translate ? translateForecast(catalogue, request, result, theoryBs) : [];
  const asked = new Set(request.b);
  const keep = bs.map((b) => asked.has(b));
  const networks = result.networks.map((n) => ({ ...n, rows: n.rows.filter((_, i) => keep[i]) }));
  const matrices = result.matrices?.filter((_, i) => keep[i]);
  return {
    ...result,
    networks,
    ...(matrices ? { matrices } : {}),
    translations: translated,
    catalogue_revision: catalogue?.revision ?? null,
  };
}

/**
 * The checks of a forecast grid that depend on each source (masses, distance, every detector's band),
 * run before the job is queued so bad input is a 400 naming the source, not a failed job. Cheap by
 * construction: 100 grid points, one b, and the networks checked on the first source only.
 */
export function checkGridSources(request: ForecastSettings & { sources: ForecastRequest["source"][] }, curves: readonly CustomCurveData[], rename: (i: number) => (field: string) => string): void {
  request.sources.forEach((source, i) => {
    try {
      checkOne(source, i);
    } catch (err) {
      if (!(err instanceof ValidationError) || err.message.includes(`sources.${i}`)) throw err;
      throw new ValidationError(err.message.replace("Invalid request body: ", `Invalid request body: for sources.${i}: `), err.fields);
    }
  });
  function checkOne(source: ForecastRequest["source"], i: number): void {
    asValidation(
      () =>
        runForecast(
          {
            source,
            ...(request.cosmology ? { cosmology: request.cosmology } : {}),
            detectors: request.detectors,
            networks: i === 0 ? request.networks : [[0]],
            b: [request.b[0]!],
            upper_cut: request.upper_cut,
            coalescence: request.coalescence,
            grid_points: 100,
          },
          [...curves],
        ),
      rename(i),
    );
  }
}
