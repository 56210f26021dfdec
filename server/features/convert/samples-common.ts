import { bOfRequest } from "../../../common/convert-samples.ts";
import type { Caution } from "../../../common/convert.ts";
import { ValidationError } from "../../errors.ts";
import type { Binary } from "../../physics/binary.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import { degeneracyOfB, gimrFactor, type GimrIndex } from "../../physics/taylorf2.ts";
import type { CompiledCatalogue, CompiledTheory, ReadyMapping } from "./compiled-catalogue.ts";
import { shortCitation } from "./reference-compare.ts";

/**
 * What the samples and events routes share: picking the one theory and its mapping at the bound's b
 * (a refusal names `theory`, `b` or `k`), and the per-binary factor that turns |dphi_k| into |beta|.
 */

export interface Target {
  theory: CompiledTheory;
  ready: ReadyMapping;
  b: number;
}

type Selecting = {
  theory: string;
  coupling?: string | undefined;
  parameter: "ppe_beta" | "gimr_dphi";
  b?: number | undefined;
  k?: number | string | undefined;
  /** The bodies the samples describe, when known: a mapping derived only for some kinds refuses the others. */
  bodies?: readonly ("bh" | "ns")[] | undefined;
};

export function selectTarget(catalogue: CompiledCatalogue, request: Selecting): Target {
  const theory = catalogue.bySlug.get(request.theory);
  if (!theory) {
    const known = [...catalogue.bySlug.keys()].sort().join(", ");
    throw new ValidationError(`Invalid theory: unknown theory "${request.theory}"`, { theory: `unknown theory "${request.theory}"; accepted theories are ${known}` });
  }
  const field = request.parameter === "ppe_beta" ? "b" : "k";
  const b = bOfRequest(request);
  if (b === null) throw new ValidationError(`Invalid k: δφ_${String(request.k)} multiplies a log term and has no single-b ppE equivalent`, { k: "log terms have no single-b ppE equivalent" });
  const degenerate = degeneracyOfB(b);
  if (degenerate) throw new ValidationError(`Invalid ${field}: ${degenerate}`, { [field]: degenerate });
  const atB = theory.mappings.filter((m) => Math.abs(m.compiled.b - b) < 1e-9);
  if (atB.length === 0) {
    const message = `${theory.theory.name} enters at b = ${theory.bs.join(", ") || "none"}, not at b = ${b}`;
    throw new ValidationError(`Invalid ${field}: ${message}`, { [field]: message });
  }
  const symbols = atB.map((m) => m.compiled.coupling.symbol);
  let ready = atB[0]!;
  if (request.coupling !== undefined) {
    const chosen = atB.find((m) => m.compiled.coupling.symbol === request.coupling);
    if (!chosen) {
      const message = `${theory.theory.name} has no coupling "${request.coupling}" at b = ${b}; its couplings there are ${symbols.join(", ")}`;
      throw new ValidationError(`Invalid coupling: ${message}`, { coupling: message });
    }
    ready = chosen;
  } else if (atB.length > 1) {
    const message = `${theory.theory.name} has ${atB.length} couplings at b = ${b} (${symbols.join(", ")}): name one in coupling`;
    throw new ValidationError(`Invalid coupling: ${message}`, { coupling: message });
  }
  // The same body rule as a single bound (mass loss answers only for black holes): refused before any sample is read.
  const onlyFor = ready.compiled.onlyFor;
  if (onlyFor && request.bodies && request.bodies.some((k) => !onlyFor.bodies.includes(k))) {
    const message = `${theory.theory.name}'s mapping holds only for ${onlyFor.bodies.join("/")} bodies (${onlyFor.description}); these samples are ${request.bodies.join("-")}`;
    throw new ValidationError(`Invalid bodies: ${message}`, { bodies: message });
  }
  return { theory, ready, b };
}

/** |beta| per unit of the stated deviation: 1 for ppE beta, |(3/128) phi_k eta^(-k/5)| for gIMR. */
export function betaPerUnit(request: { parameter: "ppe_beta" | "gimr_dphi"; k?: number | string | undefined; includes_spin: boolean }, binary: Binary): number {
  if (request.parameter === "ppe_beta") return 1;
  const f = gimrFactor(request.k as GimrIndex, binary.eta, {
    includesSpin: request.includes_spin,
    spins: { eta: binary.eta, dm: binary.dm, chi_s: binary.chi_s, chi_a: binary.chi_a, bodies: binary.bodies },
  });
  if (f.status !== "ok") throw new PhysicsInputError("k", f.reason);
  return Math.abs(f.factor);
}

export function targetReferences(target: Target): { key: string; citation: string }[] {
  const refs = target.theory.theory.references;
  return target.ready.notes.referenceKeys.map((key) => {
    const ref = refs.find((r) => r.key === key);
    return { key, citation: ref ? shortCitation(ref) : key };
  });
}

/** The cautions every sample or event translation with this mapping carries. */
export function mappingCautions(target: Target): Caution[] {
  const engine = (target.ready.compiled.cautions ?? []).map((c): Caution => ({ code: "engine", message: `${c.charAt(0).toUpperCase()}${c.slice(1)}${c.endsWith(".") ? "" : "."}` }));
  const held = target.ready.compiled.heldFixed;
  if (held && Object.keys(held).length > 0) {
    engine.push({ code: "couplings", message: `Other couplings held at their GR value: ${Object.entries(held).map(([k, v]) => `${k} = ${v}`).join(", ")}.` });
  }
  const pn = target.ready.notes.pnOrder;
  return [{ code: "leading_pn", message: `Leading-PN mapping${pn === null ? "" : ` (${pn}PN relative order)`}: the theory's higher-order terms are left out.` }, ...engine];
}
