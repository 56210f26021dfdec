/**
 * Kerr innermost stable circular orbit (Bardeen, Press & Teukolsky 1972, prograde branch for
 * chi > 0 and retrograde for chi < 0 [standard result, value from memory]) and the split frequency
 * of the inspiral-merger-ringdown consistency test: twice the orbital frequency at the ISCO of the
 * remnant, f_c = 1 / (pi M_f (r_ISCO^(3/2) + chi_f)) with M_f in seconds (Ghosh et al. 2016, 2018).
 */
import { PhysicsInputError, requireFinite } from "../input-error.ts";
import { SOLAR_MASS_TIME_S } from "../units.ts";

/** r_ISCO / M for dimensionless spin chi (|chi| < 1). */
export function kerrIscoRadius(chi: number): number {
  requireFinite("chi_f", chi);
  if (Math.abs(chi) >= 1) throw new PhysicsInputError("chi_f", "chi_f must satisfy |chi_f| < 1");
  const z1 = 1 + Math.cbrt(1 - chi * chi) * (Math.cbrt(1 + chi) + Math.cbrt(1 - chi));
  const z2 = Math.sqrt(3 * chi * chi + z1 * z1);
  return 3 + z2 - Math.sign(chi) * Math.sqrt((3 - z1) * (3 + z1 + 2 * z2));
}

/** Split frequency in Hz for a remnant of mass `massSolar` (the frame of the result is the frame of the mass). */
export function splitFrequencyHz(massSolar: number, chi: number): number {
  requireFinite("M_f", massSolar);
  if (massSolar <= 0) throw new PhysicsInputError("M_f", "M_f must be positive (solar masses)");
  const r = kerrIscoRadius(chi);
  return 1 / (Math.PI * massSolar * SOLAR_MASS_TIME_S * (r ** 1.5 + chi));
}
