import { convertRequestSchema } from "../../../common/convert.ts";
import type {
  CombineRequest,
  CombineResponse,
  CurveInfoDto,
  CurveUpload,
  ForecastRequest,
  ForecastResponse,
  ForecastTranslationDto,
} from "../../../common/forecasts.ts";
import { NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { parseWith } from "../../http/route.ts";
import { combineFisher, type UploadedFisher } from "../../physics/forecast/combine.ts";
import { BUILT_IN_CURVES } from "../../physics/forecast/curves.ts";
import { DEFAULT_PRIORS, type CustomCurveData, type ForecastResult, type PriorWidths } from "../../physics/forecast/forecast.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import type { ConvertService } from "../convert/service.ts";
import { parseCurveTable } from "./curve-table.ts";
import { parseFisherCsv } from "./fisher-csv.ts";
import type { ForecastPool } from "./pool.ts";
import type { CurveSummaryRow, CurvesRepository } from "./repository.ts";

export const MAX_CURVES_PER_USER = 50;

function asValidation<T>(fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    if (err instanceof PhysicsInputError) {
      const text = err.message.startsWith(err.field) ? err.message : `${err.field}: ${err.message}`;
      throw new ValidationError(`Invalid request body: ${text}`, { [err.field]: err.message });
    }
    throw err;
  }
}

function customInfo(row: CurveSummaryRow): CurveInfoDto {
  return {
    id: `custom:${row.id}`,
    name: row.name,
    source: "uploaded by you",
    convention: row.convention,
    convention_note: `declared at upload (${row.uploaded_kind.toUpperCase()} table)`,
    f_min: row.f_min,
    f_max: row.f_max,
    default_f_low: row.f_min,
    space: row.space,
    custom: true,
    points: row.points,
    created_at: row.created_at.toISOString(),
  };
}

export function builtInCurveInfo(): CurveInfoDto[] {
  return BUILT_IN_CURVES.map((c) => ({
    id: c.id,
    name: c.name,
    source: c.source,
    convention: c.convention,
    convention_note: c.conventionNote,
    f_min: c.fMin,
    f_max: c.fMax,
    default_f_low: c.defaultFLow,
    space: c.space,
    custom: false,
    points: null,
    created_at: null,
  }));
}

function resolvePriors(p: ForecastRequest["priors"]): PriorWidths {
  return {
    phi_c: p?.phi_c === undefined ? DEFAULT_PRIORS.phi_c : p.phi_c,
    chi_s: p?.chi_s === undefined ? DEFAULT_PRIORS.chi_s : p.chi_s,
    chi_a: p?.chi_a === undefined ? DEFAULT_PRIORS.chi_a : p.chi_a,
  };
}

export interface ForecastsService {
  curves(who: Identity | undefined): Promise<CurveInfoDto[]>;
  uploadCurve(who: Identity, upload: CurveUpload): Promise<CurveInfoDto>;
  deleteCurve(who: Identity, id: number): Promise<void>;
  forecast(who: Identity | undefined, request: ForecastRequest): Promise<ForecastResponse>;
  combine(request: CombineRequest): CombineResponse;
}

export function forecastsService(repo: CurvesRepository, pool: ForecastPool, translator: ConvertService): ForecastsService {
  async function customCurves(who: Identity | undefined, request: ForecastRequest): Promise<CustomCurveData[]> {
    const wanted = request.detectors.map((d, i) => ({ i, m: /^custom:(\d+)$/.exec(d.curve) })).filter((x) => x.m);
    if (wanted.length === 0) return [];
    if (!who) {
      const first = wanted[0]!;
      throw new ValidationError(`Invalid request body: detectors.${first.i}.curve: sign in to use your uploaded curves`, {
        [`detectors.${first.i}.curve`]: "sign in to use your uploaded curves",
      });
    }
    const ids = [...new Set(wanted.map((w) => Number(w.m![1])))];
    const rows = await repo.findOwned(who.id, ids);
    for (const w of wanted) {
      if (!rows.some((r) => r.id === Number(w.m![1]))) {
        throw new ValidationError(`Invalid request body: detectors.${w.i}.curve: you have no uploaded curve ${request.detectors[w.i]!.curve}`, {
          [`detectors.${w.i}.curve`]: `you have no uploaded curve ${request.detectors[w.i]!.curve}`,
        });
      }
    }
    return rows.map((r) => ({ id: `custom:${r.id}`, name: r.name, convention: r.convention, space: r.space, frequencies: r.frequencies, psd: r.psd }));
  }

  async function translations(request: ForecastRequest, result: ForecastResult, theoryBs: readonly number[]): Promise<ForecastTranslationDto[]> {
    const out: ForecastTranslationDto[] = [];
    for (const [ni, network] of result.networks.entries()) {
      for (const b of theoryBs) {
        const row = network.rows.find((r) => r.b === b);
        if (!row || row.bound === null) continue;
        // Two-sided: |beta| < B. One-sided: the sign is the theory's, so both one-sided intervals are
        // translated and each theory keeps the side its beta lives on (the translator says which).
        const intervals: [number | null, number | null][] = request.sides === "two" ? [[-row.bound, row.bound]] : [[-row.bound, null], [null, row.bound]];
        const answers = [];
        for (const interval of intervals) {
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
          answers.push({ interval, answer: await translator.convert(convertRequest) });
        }
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

  return {
    async curves(who) {
      const custom = who ? (await repo.listByOwner(who.id)).map(customInfo) : [];
      return [...builtInCurveInfo(), ...custom];
    },

    async uploadCurve(who, upload) {
      const table = parseCurveTable(upload.data, upload.kind);
      if ((await repo.countByOwner(who.id)) >= MAX_CURVES_PER_USER) {
        throw new ValidationError(`Invalid request body: you already have ${MAX_CURVES_PER_USER} curves; delete one first`, { name: `at most ${MAX_CURVES_PER_USER} curves per user` });
      }
      const row = await repo.insert({
        owner_id: who.id,
        name: upload.name,
        convention: upload.convention,
        space: upload.space,
        uploaded_kind: upload.kind,
        frequencies: table.frequencies,
        psd: table.psd,
      });
      return customInfo(row);
    },

    async deleteCurve(who, id) {
      if (!(await repo.delete(who.id, id))) throw new NotFoundError(`You have no uploaded curve ${id}.`);
    },

    async forecast(who, request) {
      const curves = await customCurves(who, request);
      const catalogue = request.translate ? await translator.catalogue() : null;
      const theoryBs = catalogue ? [...new Set(catalogue.theories.flatMap((t) => t.bs))].filter((b) => Number.isFinite(b) && b >= -20 && b <= 10).sort((x, y) => x - y) : [];
      const bs = [...new Set([...request.b, ...theoryBs])];
      const result = await pool.run(
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
          include_matrices: request.include_matrices,
        },
        curves,
      );
      const translated = catalogue ? await translations(request, result, theoryBs) : [];
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
    },

    combine(request) {
      const matrices: UploadedFisher[] = request.matrices.map((m, i) => {
        const label = m.label ?? `matrix ${i}`;
        if (m.csv !== undefined) return { label, ...parseFisherCsv(m.csv, `matrices.${i}.csv`) };
        return { label, parameters: m.parameters!, matrix: m.matrix! };
      });
      const networks = request.networks ?? [...matrices.map((_, i) => [i]), ...(matrices.length > 1 ? [matrices.map((_, i) => i)] : [])];
      const priors = resolvePriors(request.priors);
      return asValidation(() => combineFisher({ matrices, networks, target: request.target, priors, credibility: request.credibility, sides: request.sides }));
    },
  };
}
