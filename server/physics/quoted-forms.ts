/**
 * How a coupling limit, computed in the engine's canonical geometric unit (km^n), is shown in the
 * unit the literature quotes it in: sqrt(alpha) in km for an alpha of dimension length^2, lambda_g
 * in km together with m_g in eV, Gdot/G in 1/yr, and so on.
 */
import {
  dispersionLengthToAmplitudeEv,
  geometricToSolarMassPerYear,
  inverseLengthToPerYear,
  kmToMicrometres,
  lambdaToGravitonMassEv,
  micrometresToKm,
  perYearToInverseLength,
  solarMassPerYearToGeometric,
} from "./units.ts";

export type QuotedFormName =
  | "identity"
  | "sqrt"
  | "per_year"
  | "micrometre"
  | "solar_mass_per_year"
  | "graviton_wavelength"
  | "dispersion_length";

export const QUOTED_FORM_NAMES: readonly QuotedFormName[] = [
  "identity",
  "sqrt",
  "per_year",
  "micrometre",
  "solar_mass_per_year",
  "graviton_wavelength",
  "dispersion_length",
];

export interface QuotedFormSpec {
  readonly form: QuotedFormName;
  /** Name of the quoted quantity, e.g. "sqrt_alpha". */
  readonly symbol: string;
  readonly latex: string;
  /** Unit of the quoted quantity, e.g. "km", "1/yr", "um". */
  readonly unit: string;
  /** Exponent of the modified dispersion, for "dispersion_length". */
  readonly alphaMd?: number;
}

export type Side = "upper" | "lower";

export interface QuotedValue {
  readonly symbol: string;
  readonly latex: string;
  readonly value: number;
  readonly unit: string;
  readonly side: Side;
}

export function flipSide(side: Side): Side {
  return side === "upper" ? "lower" : "upper";
}

/** The quoted quantity as a function of the canonical coupling; always increasing. */
export function quotedValueOf(form: QuotedFormName, canonical: number): number {
  switch (form) {
    case "identity":
      return canonical;
    case "sqrt":
      return Math.sqrt(canonical);
    case "per_year":
      return inverseLengthToPerYear(canonical);
    case "micrometre":
      return kmToMicrometres(canonical);
    case "solar_mass_per_year":
      return geometricToSolarMassPerYear(canonical);
    case "graviton_wavelength":
    case "dispersion_length":
      return canonical;
  }
}

/** Inverse of quotedValueOf: the canonical coupling for a quoted value. */
export function canonicalValueOf(form: QuotedFormName, quoted: number): number {
  switch (form) {
    case "identity":
    case "graviton_wavelength":
    case "dispersion_length":
      return quoted;
    case "sqrt":
      return quoted * quoted;
    case "per_year":
      return perYearToInverseLength(quoted);
    case "micrometre":
      return micrometresToKm(quoted);
    case "solar_mass_per_year":
      return solarMassPerYearToGeometric(quoted);
  }
}

/**
 * A quoted value in convention `from` expressed in convention `to`. Each factor relates its
 * convention to the reference one: coupling_ref = factor * coupling_conv. For a coupling of
 * dimension length^2 quoted as its square root the quoted value scales by sqrt(from / to).
 */
export function convertQuotedConvention(quoted: number, form: QuotedFormName, fromFactor: number, toFactor: number): number {
  if (!(fromFactor > 0) || !(toFactor > 0)) throw new RangeError("convention factors must be positive");
  return quotedValueOf(form, (canonicalValueOf(form, quoted) * fromFactor) / toFactor);
}

/** The limit in the quoted unit, plus the derived quantities a reader also expects (m_g for lambda_g). */
export function presentLimit(
  canonical: number,
  side: Side,
  spec: QuotedFormSpec,
): { primary: QuotedValue; extras: QuotedValue[] } {
  const primary: QuotedValue = {
    symbol: spec.symbol,
    latex: spec.latex,
    value: quotedValueOf(spec.form, canonical),
    unit: spec.unit,
    side,
  };
  const extras: QuotedValue[] = [];
  if (spec.form === "graviton_wavelength") {
    // m_g = h c / lambda_g decreases with lambda_g: a lower bound on one is an upper bound on the other.
    extras.push({ symbol: "m_g", latex: "m_g", value: lambdaToGravitonMassEv(canonical), unit: "eV", side: flipSide(side) });
  }
  if (spec.form === "dispersion_length") {
    const a = spec.alphaMd;
    if (a === undefined || a === 2) throw new RangeError("dispersion_length needs alpha_md != 2");
    const exponent = 2 - a;
    extras.push({
      symbol: "abs_A",
      latex: "|A|",
      value: dispersionLengthToAmplitudeEv(canonical, a),
      unit: `eV^${formatExponent(exponent)}`,
      side: exponent > 0 ? flipSide(side) : side,
    });
  }
  return { primary, extras };
}

function formatExponent(x: number): string {
  return Number.isInteger(x) ? String(x) : `(${x})`;
}
