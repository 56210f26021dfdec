/**
 * Every physical constant and unit conversion the physics engine uses, in one place.
 *
 * The engine works in geometric units (G = c = 1) with the kilometre as its length: a mass m is
 * the length G m / c^2, a time t is the length c t, a rate is an inverse length. Values typed here
 * are the defining or nominal ones; everything else is derived from them so that a change of a
 * defining value cannot leave a stale derived number behind.
 */

/** Speed of light, m/s (exact, SI definition). */
export const SPEED_OF_LIGHT_M_S = 299_792_458;
/** Speed of light, km/s. */
export const SPEED_OF_LIGHT_KM_S = SPEED_OF_LIGHT_M_S / 1000;

/** Newton's constant, m^3 kg^-1 s^-2 (CODATA 2018). */
export const GRAVITATIONAL_CONSTANT_SI = 6.6743e-11;

/** Nominal solar mass parameter (G M)_sun, m^3/s^2 (IAU 2015 Resolution B3, exact by definition). */
export const SOLAR_MASS_PARAMETER_SI = 1.3271244e20;

/**
 * Solar mass in kg. Only as good as G (relative uncertainty ~2e-5); the engine never needs it,
 * because every mass enters as G M, known to the precision of the nominal value above.
 */
export const SOLAR_MASS_KG = SOLAR_MASS_PARAMETER_SI / GRAVITATIONAL_CONSTANT_SI;

/** G M_sun / c^2 in metres (~1476.625 m). */
export const SOLAR_MASS_LENGTH_M = SOLAR_MASS_PARAMETER_SI / SPEED_OF_LIGHT_M_S ** 2;
/** G M_sun / c^2 in kilometres. */
export const SOLAR_MASS_LENGTH_KM = SOLAR_MASS_LENGTH_M / 1000;
/** G M_sun / c^3 in seconds (~4.925491e-6 s). */
export const SOLAR_MASS_TIME_S = SOLAR_MASS_PARAMETER_SI / SPEED_OF_LIGHT_M_S ** 3;

/** Astronomical unit, m (IAU 2012 Resolution B2, exact). */
export const ASTRONOMICAL_UNIT_M = 149_597_870_700;
/** Parsec, m: (648000 / pi) au (IAU 2015 Resolution B2). */
export const PARSEC_M = (648_000 / Math.PI) * ASTRONOMICAL_UNIT_M;
/** Megaparsec, m. */
export const MEGAPARSEC_M = 1e6 * PARSEC_M;
/** Megaparsec, km. */
export const MEGAPARSEC_KM = MEGAPARSEC_M / 1000;

/** Julian year, s (IAU). */
export const JULIAN_YEAR_S = 31_557_600;

/** Planck constant, J s (exact, SI 2019). */
export const PLANCK_J_S = 6.62607015e-34;
/** Elementary charge, i.e. one electronvolt in joules (exact, SI 2019). */
export const ELECTRON_VOLT_J = 1.602176634e-19;
/** Planck constant in eV s (~4.135667696e-15). */
export const PLANCK_EV_S = PLANCK_J_S / ELECTRON_VOLT_J;
/** h c in eV m (~1.239841984e-6). */
export const PLANCK_C_EV_M = PLANCK_EV_S * SPEED_OF_LIGHT_M_S;

/** Euler–Mascheroni constant (appears in the 3PN TaylorF2 coefficient). */
export const EULER_GAMMA = 0.5772156649015329;

// ---------------------------------------------------------------------------------------------
// Lengths

export function metresToKm(metres: number): number {
  return metres / 1000;
}

export function kmToMetres(km: number): number {
  return km * 1000;
}

/** Alias kept for readability at call sites that think of "a length in metres". */
export function lengthToKm(metres: number): number {
  return metresToKm(metres);
}

export function kmToMicrometres(km: number): number {
  return km * 1e9;
}

export function micrometresToKm(micrometres: number): number {
  return micrometres / 1e9;
}

export function mpcToKm(mpc: number): number {
  return mpc * MEGAPARSEC_KM;
}

export function kmToMpc(km: number): number {
  return km / MEGAPARSEC_KM;
}

// ---------------------------------------------------------------------------------------------
// Masses (geometric) and times

/** Solar masses -> geometric length G m / c^2 in km. */
export function solarMassToKm(solarMasses: number): number {
  return solarMasses * SOLAR_MASS_LENGTH_KM;
}

/** Geometric length in km -> solar masses. */
export function kmToSolarMass(km: number): number {
  return km / SOLAR_MASS_LENGTH_KM;
}

/** Solar masses -> geometric time G m / c^3 in s. */
export function solarMassToSeconds(solarMasses: number): number {
  return solarMasses * SOLAR_MASS_TIME_S;
}

/** A time in seconds -> the length c t in km. */
export function secondsToKm(seconds: number): number {
  return seconds * SPEED_OF_LIGHT_KM_S;
}

/** A length in km -> the light-travel time in s. */
export function kmToSeconds(km: number): number {
  return km / SPEED_OF_LIGHT_KM_S;
}

// ---------------------------------------------------------------------------------------------
// Rates

/**
 * A rate expressed as an inverse length (1/km, geometric) -> 1/yr.
 * A rate r [1/s] is r / c [1/km]; hence x [1/km] = x c [1/s] = x c yr [1/yr].
 */
export function inverseLengthToPerYear(perKm: number): number {
  return perKm * SPEED_OF_LIGHT_KM_S * JULIAN_YEAR_S;
}

export function perYearToInverseLength(perYear: number): number {
  return perYear / (SPEED_OF_LIGHT_KM_S * JULIAN_YEAR_S);
}

/**
 * A mass-loss rate in M_sun/yr -> the dimensionless geometric rate dM/dt (G/c^3 units):
 * (G M_sun / c^3) / yr.
 */
export function solarMassPerYearToGeometric(solarMassesPerYear: number): number {
  return (solarMassesPerYear * SOLAR_MASS_TIME_S) / JULIAN_YEAR_S;
}

export function geometricToSolarMassPerYear(rate: number): number {
  return (rate * JULIAN_YEAR_S) / SOLAR_MASS_TIME_S;
}

// ---------------------------------------------------------------------------------------------
// Energies, frequencies and wavelengths

/** Photon-like energy of a quantum of frequency f: E = h f, in eV. */
export function frequencyToEv(hertz: number): number {
  return hertz * PLANCK_EV_S;
}

export function evToFrequency(eV: number): number {
  return eV / PLANCK_EV_S;
}

/**
 * Graviton Compton wavelength (km) -> graviton mass (eV/c^2), from m_g c^2 = h c / lambda_g.
 * Decreasing: a lower bound on lambda_g is an upper bound on m_g.
 */
export function lambdaToGravitonMassEv(lambdaKm: number): number {
  return PLANCK_C_EV_M / kmToMetres(lambdaKm);
}

/** Graviton mass (eV/c^2) -> Compton wavelength (km). */
export function gravitonMassEvToLambdaKm(massEv: number): number {
  return metresToKm(PLANCK_C_EV_M / massEv);
}

/**
 * Length scale lambda (km) of a modified dispersion E^2 = p^2 + A p^alpha_md, with
 * lambda_A = h A^(1/(alpha_md - 2)) (c = 1), -> |A| in eV^(2 - alpha_md):
 * |A| = (h c / lambda_A)^(2 - alpha_md).
 */
export function dispersionLengthToAmplitudeEv(lambdaKm: number, alphaMd: number): number {
  return (PLANCK_C_EV_M / kmToMetres(lambdaKm)) ** (2 - alphaMd);
}

export function dispersionAmplitudeEvToLength(amplitude: number, alphaMd: number): number {
  return metresToKm(PLANCK_C_EV_M / amplitude ** (1 / (2 - alphaMd)));
}
