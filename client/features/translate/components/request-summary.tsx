import { catalogueVersionText } from "../../../../common/catalogue-version.ts";
import type { ConvertRequest } from "../../../../common/convert.ts";
import { sciText } from "../../../components/ui/text-format.ts";

/**
 * Every input that shaped the numbers, restated beside them: the bound (whatever its form), the
 * binary, the cosmology, the conventions and the catalogue version. Fields this component does not
 * know by name (a new bound kind) are still listed, by their API name.
 */
const BOUND_LABELS: Record<string, string> = {
  b: "b",
  a: "a",
  z: "z",
  k: "k",
  upper: "upper bound",
  interval: "interval",
  credibility: "credibility",
  sign_convention: "phase convention",
  includes_spin: "spin-including φ_k",
  f_low: "f_low (Hz)",
};

function value(v: unknown): string {
  if (typeof v === "number") return Number.isInteger(v) ? String(v).replace("-", "−") : sciText(v, 4);
  if (v === null || v === undefined) return "open";
  if (Array.isArray(v)) return `[${v.map(value).join(", ")}]`;
  if (typeof v === "boolean") return v ? "yes" : "no";
  return String(v);
}

function boundWords(bound: ConvertRequest["bound"]): string {
  const head =
    bound.parameter === "ppe_beta" ? "ppE β" : bound.parameter === "ppe_alpha" ? "ppE amplitude α" : bound.parameter === "distance_ratio" ? "distance ratio d_L^GW / d_L^EM" : "gIMR δφ_k";
  const parts = Object.entries(bound)
    .filter(([k]) => k !== "parameter")
    .map(([k, v]) => {
      if (k === "credibility" && typeof v === "number") return `${Math.round(v * 1000) / 10}% credibility`;
      if (k === "sign_convention") return v === "minus" ? "stated for exp(−iΨ)" : "exp(+iΨ)";
      return `${BOUND_LABELS[k] ?? k} = ${value(v)}`;
    });
  return `${head}: ${parts.join(", ")}`;
}

function binaryWords(b: ConvertRequest["binary"]): string {
  const kinds = b.bodies.map((x) => (x === "bh" ? "black hole" : "neutron star")).join(" + ");
  const parts = [`m₁ = ${value(b.m1)} M☉`, `m₂ = ${value(b.m2)} M☉`, `χ₁ = ${value(b.chi1)}`, `χ₂ = ${value(b.chi2)}`, kinds, `${b.frame} frame`];
  if (b.z !== undefined) parts.push(`z = ${value(b.z)}`);
  if (b.scalar_sensitivities) parts.push(`scalar sensitivities ${value(b.scalar_sensitivities)}`);
  return parts.join(", ");
}

export function RequestSummary({ request, cosmology, catalogueVersion }: { request: ConvertRequest; cosmology: { H0: number; Omega_m: number }; catalogueVersion: string }) {
  const conventions = Object.entries(request.conventions ?? {});
  return (
    <dl className="grid gap-x-4 gap-y-1 text-sm text-ink-soft sm:grid-cols-[auto_1fr]" data-testid="request-summary">
      <dt className="font-semibold text-ink">Bound</dt>
      <dd>{boundWords(request.bound)}</dd>
      <dt className="font-semibold text-ink">Binary</dt>
      <dd>{binaryWords(request.binary)}</dd>
      <dt className="font-semibold text-ink">Cosmology</dt>
      <dd>
        H₀ = {cosmology.H0} km/s/Mpc, Ωₘ = {cosmology.Omega_m}, flat
      </dd>
      {request.theories && (
        <>
          <dt className="font-semibold text-ink">Theories</dt>
          <dd>{request.theories.join(", ")}</dd>
        </>
      )}
      {conventions.length > 0 && (
        <>
          <dt className="font-semibold text-ink">Conventions</dt>
          <dd>{conventions.map(([t, c]) => `${t}: ${c}`).join("; ")}</dd>
        </>
      )}
      <dt className="font-semibold text-ink">Catalogue</dt>
      <dd>
        <span title={`catalogue version ${catalogueVersion}`} className="underline decoration-dotted">
          {catalogueVersionText(catalogueVersion)}
        </span>
      </dd>
    </dl>
  );
}
