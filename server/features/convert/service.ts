import type { BoundRequest, ConvertRequest, ConvertResponse, ConvertTableRequest, ConvertTableResponse } from "../../../common/convert.ts";
import { ValidationError } from "../../errors.ts";
import type { CatalogueReader } from "./catalogue-snapshot.ts";
import { compileCatalogue, type CompiledCatalogue } from "./compiled-catalogue.ts";
import { checkSelection, prepareBinary, translate, translateBound } from "./translate.ts";

/**
 * The translator's use cases. The accepted catalogue is compiled once per catalogue revision and
 * kept in process; every request first asks the reader for the (cheap) revision token, so an editor's
 * publication is picked up by the next translation without a restart.
 */
export interface ConvertService {
  convert(request: ConvertRequest): Promise<ConvertResponse>;
  convertTable(request: ConvertTableRequest): Promise<ConvertTableResponse>;
  /** The compiled catalogue at its current revision (sheets and the benchmark use it). */
  catalogue(): Promise<CompiledCatalogue>;
}

export function convertService(reader: CatalogueReader): ConvertService {
  let cached: { token: string; compiled: CompiledCatalogue } | undefined;
  let loading: { token: string; promise: Promise<CompiledCatalogue> } | undefined;

  const catalogue = async (): Promise<CompiledCatalogue> => {
    const token = await reader.revision();
    if (cached?.token === token) return cached.compiled;
    // Concurrent requests after a change share one load instead of each compiling the catalogue.
    if (loading?.token !== token) {
      const promise = reader.load().then((snapshot) => {
        const compiled = compileCatalogue(snapshot);
        cached = { token, compiled };
        return compiled;
      });
      loading = { token, promise };
      promise.finally(() => {
        if (loading?.promise === promise) loading = undefined;
      }).catch(() => undefined);
    }
    return loading.promise;
  };

  return {
    catalogue,
    async convert(request) {
      return translate(await catalogue(), request);
    },
    async convertTable(request) {
      const compiled = await catalogue();
      checkSelection(compiled, request.theories, undefined);
      const prepared = prepareBinary(request.binary, request.cosmology, request.f_low);
      const rows = request.rows.map((row, index) => {
        const value = {
          ...(row.upper !== undefined ? { upper: row.upper } : {}),
          ...(row.interval !== undefined ? { interval: row.interval } : {}),
          credibility: request.credibility,
          f_low: request.f_low,
        };
        const bound: BoundRequest =
          row.k !== undefined
            ? { parameter: "gimr_dphi" as const, k: row.k, ...value, includes_spin: request.includes_spin }
            : { parameter: "ppe_beta" as const, b: row.b!, ...value, sign_convention: request.sign_convention };
        let answer: ConvertResponse;
        try {
          answer = translateBound(compiled, prepared, bound, { ...(request.theories ? { theories: request.theories } : {}) });
        } catch (err) {
          if (err instanceof ValidationError && err.fields) {
            const fields = Object.fromEntries(Object.entries(err.fields).map(([k, v]) => [`rows.${index}.${k}`, v]));
            throw new ValidationError(`Invalid row ${index}: ${err.message}`, fields);
          }
          throw err;
        }
        return {
          index,
          label: row.label ?? null,
          input: { b: row.b ?? null, k: row.k ?? null, upper: row.upper ?? null, interval: row.interval ?? null },
          b: answer.bound.b,
          beta_max: answer.bound.beta_max,
          results: answer.results,
          not_applicable: answer.not_applicable,
          cautions: answer.cautions,
        };
      });
      return { catalogue_revision: compiled.revision, cosmology: { H0: prepared.cosmology.H0, Omega_m: prepared.cosmology.Omega_m }, rows };
    },
  };
}
