import type { RingdownConvertRequest } from "../../../common/ringdown.ts";
import { binarySymbols, makeBinary } from "../../physics/binary.ts";
import { remnantFromBinary } from "../../physics/ringdown/remnant.ts";
import { solarMassToKm } from "../../physics/units.ts";

export interface ResolvedRemnant {
  /** Source-frame remnant mass, solar masses. */
  M_f_source: number;
  chi_f: number;
  from: "given" | "fit";
  z?: number;
  chi_f_alternative?: number;
  chi_f_fit_spread?: number;
  /** Symbols for the mappings: M_f (km), chi_f, and the binary's when it was given. */
  env: Record<string, number>;
}

/** The remnant the ringdown mappings are evaluated at: as given, or from the binary through the fits. */
export function resolveRemnant(req: Pick<RingdownConvertRequest, "remnant" | "binary">): ResolvedRemnant {
  if (req.remnant) {
    const r = req.remnant;
    const M = r.frame === "detector" ? r.M_f / (1 + (r.z ?? 0)) : r.M_f;
    return {
      M_f_source: M,
      chi_f: r.chi_f,
      from: "given",
      ...(r.z === undefined ? {} : { z: r.z }),
      env: { M_f: solarMassToKm(M), chi_f: r.chi_f, ...(r.z === undefined ? {} : { z: r.z }) },
    };
  }
  const b = req.binary!;
  const binary = makeBinary({ m1: b.m1, m2: b.m2, chi1: b.chi1, chi2: b.chi2, frame: b.frame, ...(b.z === undefined ? {} : { z: b.z }) });
  const fit = remnantFromBinary({ m1: binary.m1, m2: binary.m2, chi1: binary.chi1, chi2: binary.chi2 }, "binary.");
  return {
    M_f_source: fit.M_f,
    chi_f: fit.chi_f,
    from: "fit",
    ...(b.z === undefined ? {} : { z: b.z }),
    chi_f_alternative: fit.chi_f_alternative,
    chi_f_fit_spread: fit.chi_f_fit_spread,
    env: { ...binarySymbols(binary), M_f: solarMassToKm(fit.M_f), chi_f: fit.chi_f },
  };
}
