import type {
  CombineRequest,
  CombineResponse,
  CurveInfoDto,
  CurveUpload,
  ForecastRequest,
  ForecastResponse,
} from "../../../common/forecasts.ts";
import { NotFoundError, ValidationError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { combineFisher, type UploadedFisher } from "../../physics/forecast/combine.ts";
import { BUILT_IN_CURVES } from "../../physics/forecast/curves.ts";
import type { CustomCurveData } from "../../physics/forecast/forecast.ts";
import type { ConvertService } from "../convert/service.ts";
import { parseCurveTable } from "./curve-table.ts";
import { parseFisherCsv } from "./fisher-csv.ts";
import type { ForecastPool } from "./pool.ts";
import type { CurveSummaryRow, CurvesRepository } from "./repository.ts";
import { asValidation, resolvePriors } from "./run.ts";

export const MAX_CURVES_PER_USER = 50;

function customInfo(row: CurveSummaryRow): CurveInfoDto {
  return {
    id: `custom:${row.id}`,
    name: row.name,
    source: "uploaded by you",
    convention: row.convention,
    convention_note: `declared at upload (${row.uploaded_kind.toUpperCase()} table)`,
    to_confirm: null,
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
    to_confirm: c.toConfirm ?? null,
    f_min: c.fMin,
    f_max: c.fMax,
    default_f_low: c.defaultFLow,
    space: c.space,
    custom: false,
    points: null,
    created_at: null,
  }));
}

export interface ForecastsService {
  curves(who: Identity | undefined): Promise<CurveInfoDto[]>;
  /** `field` names where the table came in (the multipart `file` or the JSON `data`), for the 400. */
  uploadCurve(who: Identity, upload: CurveUpload, field?: "file" | "data"): Promise<CurveInfoDto>;
  deleteCurve(who: Identity, id: number): Promise<void>;
  forecast(who: Identity | undefined, request: ForecastRequest): Promise<ForecastResponse>;
  combine(request: CombineRequest): CombineResponse;
  /** The caller's uploaded curves named by the detectors (400 naming the detector when one is not theirs). */
  customCurves(who: Identity | undefined, detectors: ForecastRequest["detectors"]): Promise<CustomCurveData[]>;
}

export function forecastsService(repo: CurvesRepository, pool: ForecastPool, translator: ConvertService): ForecastsService {
  async function customCurves(who: Identity | undefined, detectors: ForecastRequest["detectors"]): Promise<CustomCurveData[]> {
    const wanted = detectors.map((d, i) => ({ i, m: /^custom:(\d+)$/.exec(d.curve) })).filter((x) => x.m);
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
        throw new ValidationError(`Invalid request body: detectors.${w.i}.curve: you have no uploaded curve ${detectors[w.i]!.curve}`, {
          [`detectors.${w.i}.curve`]: `you have no uploaded curve ${detectors[w.i]!.curve}`,
        });
      }
    }
    return rows.map((r) => ({ id: `custom:${r.id}`, name: r.name, convention: r.convention, space: r.space, frequencies: r.frequencies, psd: r.psd }));
  }

  return {
    async curves(who) {
      const custom = who ? (await repo.listByOwner(who.id)).map(customInfo) : [];
      return [...builtInCurveInfo(), ...custom];
    },

    async uploadCurve(who, upload, field = "data") {
      const table = parseCurveTable(upload.data, upload.kind, field);
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
      const curves = await customCurves(who, request.detectors);
      const catalogue = request.translate ? await translator.catalogue() : null;
      return pool.run(request, curves, catalogue);
    },

    customCurves,

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
