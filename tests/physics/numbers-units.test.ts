/* eslint-disable no-loss-of-precision -- constants are written with the digits of their published source; rounding them to the nearest double is intended. */
import * as math from "mathjs";
import { describe, expect, it } from "vitest";
import {
  ASTRONOMICAL_UNIT_M,
  GRAVITATIONAL_CONSTANT_SI,
  JULIAN_YEAR_S,
  MEGAPARSEC_KM,
  PARSEC_M,
  PLANCK_C_EV_M,
  PLANCK_EV_S,
  SOLAR_MASS_LENGTH_KM,
  SOLAR_MASS_LENGTH_M,
  SOLAR_MASS_PARAMETER_SI,
  SOLAR_MASS_TIME_S,
  SPEED_OF_LIGHT_M_S,
  dispersionAmplitudeEvToLength,
  dispersionLengthToAmplitudeEv,
  geometricToSolarMassPerYear,
  gravitonMassEvToLambdaKm,
  inverseLengthToPerYear,
  kmToMpc,
  kmToSolarMass,
  lambdaToGravitonMassEv,
  mpcToKm,
  perYearToInverseLength,
  solarMassPerYearToGeometric,
  solarMassToKm,
  solarMassToSeconds,
} from "../../server/physics/units.ts";

const mathjsNumber = (expr: string, unit: string): number => math.evaluate(expr).toNumber(unit);

describe("physical constants", () => {
  it("c is the exact SI value, as in mathjs (SI 2019 definition)", () => {
    expect(SPEED_OF_LIGHT_M_S).toBe(299_792_458);
    expect(mathjsNumber("speedOfLight", "m/s")).toBe(SPEED_OF_LIGHT_M_S);
  });

  it("G is CODATA 2018 6.67430e-11 and agrees with mathjs gravitationConstant", () => {
    expect(GRAVITATIONAL_CONSTANT_SI).toBe(6.6743e-11);
    expect(mathjsNumber("gravitationConstant", "m^3 kg^-1 s^-2")).toBeCloseTo(GRAVITATIONAL_CONSTANT_SI, 20);
  });

  it("(G M)_sun is the IAU 2015 Resolution B3 nominal value", () => {
    expect(SOLAR_MASS_PARAMETER_SI).toBe(1.3271244e20);
  });

  it("G M_sun / c^2 = 1476.6250 m and G M_sun / c^3 = 4.9254909e-6 s (IAU 2015 B3, derived)", () => {
    expect(SOLAR_MASS_LENGTH_M).toBeCloseTo(1476.625, 3);
    expect(SOLAR_MASS_TIME_S).toBeCloseTo(4.9254909e-6, 13);
    // Second reference: the same quotient with mathjs's c.
    const c = mathjsNumber("speedOfLight", "m/s");
    expect(SOLAR_MASS_LENGTH_KM).toBeCloseTo(1.3271244e20 / c ** 2 / 1000, 15);
    expect(solarMassToKm(10)).toBeCloseTo(14.76625, 4);
    expect(kmToSolarMass(solarMassToKm(3.7))).toBeCloseTo(3.7, 14);
    expect(solarMassToSeconds(1)).toBe(SOLAR_MASS_TIME_S);
  });

  it("au and parsec follow IAU 2012 B2 and IAU 2015 B2", () => {
    expect(ASTRONOMICAL_UNIT_M).toBe(149_597_870_700);
    expect(PARSEC_M / 3.0856775814913673e16).toBeCloseTo(1, 15);
    expect(MEGAPARSEC_KM).toBeCloseTo(3.0856775814913673e19, 0);
    expect(kmToMpc(mpcToKm(412.5))).toBeCloseTo(412.5, 10);
  });

  it("the Julian year is 31 557 600 s (IAU), the same as mathjs's year", () => {
    expect(JULIAN_YEAR_S).toBe(31_557_600);
    expect(math.unit("1 year").toNumber("s")).toBe(JULIAN_YEAR_S);
  });

  it("h = 6.62607015e-34 J s exactly; h = 4.135667696e-15 eV s; h c = 1.239841984e-6 eV m (SI 2019, CODATA 2018)", () => {
    expect(mathjsNumber("planckConstant", "J s")).toBe(6.62607015e-34);
    expect(PLANCK_EV_S).toBeCloseTo(4.135667696e-15, 23);
    expect(PLANCK_C_EV_M).toBeCloseTo(1.239841984e-6, 15);
    // mathjs's exact elementary charge gives the same h in eV s. (Its "eV" unit is the older
    // CODATA 2010 value 1.602176565e-19 J, so it is not used as a reference here.)
    const hEv = mathjsNumber("planckConstant", "J s") / mathjsNumber("elementaryCharge", "C");
    expect(PLANCK_EV_S / hEv).toBeCloseTo(1, 15);
  });
});

describe("conversions", () => {
  it("lambda_g = 1.03e13 km <-> m_g = 1.2e-22 eV (LIGO-Virgo 2016, PRL 116 221101, arXiv:1602.03841, quotes both)", () => {
    expect(lambdaToGravitonMassEv(1.03e13)).toBeCloseTo(1.2e-22, 24);
    expect(gravitonMassEvToLambdaKm(1.2e-22) / 1e13).toBeCloseTo(1.03, 2);
    expect(lambdaToGravitonMassEv(gravitonMassEvToLambdaKm(3.3e-23))).toBeCloseTo(3.3e-23, 35);
  });

  it("an inverse length of 1/(c * 1 yr) is a rate of 1/yr", () => {
    const perKm = 1 / (299_792.458 * 31_557_600);
    expect(inverseLengthToPerYear(perKm)).toBeCloseTo(1, 14);
    expect(perYearToInverseLength(inverseLengthToPerYear(2.5e-18))).toBeCloseTo(2.5e-18, 30);
  });

  it("1 M_sun/yr is (G M_sun / c^3) / yr in geometric units", () => {
    expect(solarMassPerYearToGeometric(1)).toBeCloseTo(4.9254909e-6 / 31_557_600, 20);
    expect(geometricToSolarMassPerYear(solarMassPerYearToGeometric(7e-3))).toBeCloseTo(7e-3, 15);
  });

  it("the dispersion amplitude at alpha = 0 is m_g^2 (E^2 = p^2 + m_g^2, Mirshekari, Yunes & Will 2012)", () => {
    const lambda = 2e13;
    expect(dispersionLengthToAmplitudeEv(lambda, 0)).toBeCloseTo(lambdaToGravitonMassEv(lambda) ** 2, 60);
    expect(dispersionAmplitudeEvToLength(dispersionLengthToAmplitudeEv(5e3, 3), 3)).toBeCloseTo(5e3, 6);
  });
});
