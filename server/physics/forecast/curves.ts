/**
 * Detector noise curves: one-sided noise power spectral densities S_n(f) in 1/Hz, each with its
 * published source, the amplitude convention it must be used with and the frequency range where it
 * is defined. The convention is the trap here: a "response-averaged" curve (Robson, Cornish & Liu
 * 2019 style) already carries the sky and polarisation average of the detector response (the 10/3
 * at low frequency), so the amplitude must not be averaged again; an "instrument" curve is the bare
 * noise of one interferometer and the antenna average goes into the amplitude (see amplitude.ts).
 */
import { SPEED_OF_LIGHT_M_S } from "../units.ts";

/** How the detector's response enters the SNR (amplitude.ts turns this into a number). */
export type CurveConvention =
  /** One L-shaped (90 degree) interferometer; antenna average in the amplitude. */
  | "l_shaped"
  /** Three 60-degree interferometers in a triangle, same noise, independent: SNR^2 = 9/4 of an L. */
  | "triangle"
  /** One triangle read as two independent 60-degree channels: SNR^2 = 2 x 3/4 = 3/2 of an L. */
  | "two_channel_triangle"
  /** Response (sky, polarisation) already divided into the PSD, as in Robson, Cornish & Liu 2019. */
  | "response_averaged";

export interface CurveInfo {
  readonly id: string;
  readonly name: string;
  readonly source: string;
  readonly convention: CurveConvention;
  readonly conventionNote: string;
  /** What of the curve's convention still has to be checked against its source (shown beside it), or absent. */
  readonly toConfirm?: string;
  /** Frequencies (Hz) where the curve is defined. */
  readonly fMin: number;
  readonly fMax: number;
  /** Default lower cut of the band (Hz); space detectors are cut by their observing window instead. */
  readonly defaultFLow: number;
  /** True for detectors in space: the band comes from the observing window before merger. */
  readonly space: boolean;
}

export interface NoiseCurve extends CurveInfo {
  /** S_n(f) in 1/Hz; `years` is the observing time (only the LISA galactic foreground uses it). */
  psd(f: number, years: number): number;
}

/** Advanced LIGO design (zero-detuned high power), fit of Ajith 2011, Phys. Rev. D 84, 084037. */
function aligoDesign(f: number): number {
  const x = f / 245.4;
  return 1e-48 * (0.0152 * x ** -4 + 0.2935 * x ** 2.25 + 2.7951 * x ** 1.5 - 6.508 * x ** 0.75 + 17.7622);
}

const O1_COEFFICIENTS = [47.8466, -92.1896, 35.9273, -7.61447, 0.916742, -0.0588089, 0.00156345] as const;

/** O1-like LIGO Hanford fit (Yunes, Yagi & Pretorius 2016, Phys. Rev. D 94, 084002, App. C). */
function aligoO1(f: number): number {
  const l = Math.log(f);
  let s = 0;
  for (let i = O1_COEFFICIENTS.length - 1; i >= 0; i--) s = s * l + O1_COEFFICIENTS[i]!;
  const asd = Math.sqrt(0.8464) * Math.exp(s);
  return asd * asd;
}

/** ET-B, one interferometer (Mishra, Arun, Iyer & Sathyaprakash 2010, Phys. Rev. D 82, 064010). */
function etB(f: number): number {
  const x = f / 200;
  const b = [31.18, -64.72, 52.24, -42.16, 10.17, 11.53];
  const c = [13.58, -36.46, 18.56, 27.43];
  let num = 1;
  let den = 1;
  for (let k = 0; k < b.length; k++) num += b[k]! * x ** (k + 1);
  for (let k = 0; k < c.length; k++) den += c[k]! * x ** (k + 1);
  return 1.449e-52 * (x ** -4.05 + 185.62 * x ** -0.69 + (232.56 * num) / den);
}

const LISA_ARM_M = 2.5e9;
const LISA_FSTAR = SPEED_OF_LIGHT_M_S / (2 * Math.PI * LISA_ARM_M);

/** Galactic-confusion parameters of Robson, Cornish & Liu 2019, Table 1, by observing time. */
export const LISA_CONFUSION_ROWS = [
  { years: 0.5, alpha: 0.133, beta: 243, kappa: 482, gamma: 917, fk: 2.58e-3 },
  { years: 1, alpha: 0.171, beta: 292, kappa: 1020, gamma: 1680, fk: 2.15e-3 },
  { years: 2, alpha: 0.165, beta: 299, kappa: 611, gamma: 1340, fk: 1.73e-3 },
  { years: 4, alpha: 0.138, beta: -221, kappa: 521, gamma: 1680, fk: 1.13e-3 },
] as const;

/** The confusion row closest to the observing time (in log time). */
export function lisaConfusionRow(years: number) {
  let best: (typeof LISA_CONFUSION_ROWS)[number] = LISA_CONFUSION_ROWS[0];
  for (const row of LISA_CONFUSION_ROWS) {
    if (Math.abs(Math.log(row.years / years)) < Math.abs(Math.log(best.years / years))) best = row;
  }
  return best;
}

/** LISA instrument noise with the approximate response (RCL 2019, Eqs. 1, 9-12), no foreground. */
export function lisaInstrument(f: number): number {
  const pOms = 1.5e-11 ** 2 * (1 + (2e-3 / f) ** 4);
  const pAcc = 3e-15 ** 2 * (1 + (0.4e-3 / f) ** 2) * (1 + (f / 8e-3) ** 4);
  const c = Math.cos(f / LISA_FSTAR);
  const pn = (pOms + (2 * (1 + c * c) * pAcc) / (2 * Math.PI * f) ** 4) / LISA_ARM_M ** 2;
  return (10 / 3) * pn * (1 + 0.6 * (f / LISA_FSTAR) ** 2);
}

/** Galactic confusion noise (RCL 2019, Eq. 14 with Table 1). */
export function lisaConfusion(f: number, years: number): number {
  const r = lisaConfusionRow(years);
  return (
    9e-45 * f ** (-7 / 3) * Math.exp(-(f ** r.alpha) + r.beta * f * Math.sin(r.kappa * f)) * (1 + Math.tanh(r.gamma * (r.fk - f)))
  );
}

const TIANQIN_ARM_M = Math.sqrt(3) * 1e8;
const TIANQIN_FSTAR = SPEED_OF_LIGHT_M_S / (2 * Math.PI * TIANQIN_ARM_M);

/** TianQin (Huang et al. 2020, Phys. Rev. D 102, 063021, Eq. 13) times 10/3: the RCL convention. */
function tianqin(f: number): number {
  const sa = 1e-30;
  const sx = 1e-24;
  const sN = ((4 * sa) / (2 * Math.PI * f) ** 4 * (1 + 1e-4 / f) + sx) * (1 + 0.6 * (f / TIANQIN_FSTAR) ** 2) / TIANQIN_ARM_M ** 2;
  return (10 / 3) * sN;
}

/** DECIGO (Yagi & Seto 2011, Phys. Rev. D 83, 044011, Eq. 5; erratum Phys. Rev. D 95, 109901). */
function decigo(f: number): number {
  const r = (f / 7.36) ** 2;
  return 7.05e-48 * (1 + r) + (4.8e-51 * f ** -4) / (1 + r) + 5.33e-52 * f ** -4;
}

/** B-DECIGO (Isoyama, Nakano & Nakamura 2018, PTEP 2018, 073E01). */
function bDecigo(f: number): number {
  return 4.04e-46 * (1 + 1.584e-2 * f ** -4 + 1.584e-3 * f * f);
}

const L_NOTE = "bare noise of one L-shaped interferometer: the sky, polarisation and inclination average (4/25) is put into the amplitude";

const DECIGO_TO_CONFIRM =
  "source to be confirmed: the two-channel reading (SNR^2 = 3/2 of an L-shaped detector) is our own derivation; whether the Yagi & Seto 2011 curve (section II) already holds a channel or sky factor has not been checked against the paper";
const B_DECIGO_TO_CONFIRM =
  "source to be confirmed: read like DECIGO (two 60-degree channels); the convention of the Isoyama, Nakano & Nakamura 2018 curve has not been checked against the paper";

export const BUILT_IN_CURVES: readonly NoiseCurve[] = [
  {
    id: "aligo-design",
    name: "Advanced LIGO design",
    source: "Ajith 2011, Phys. Rev. D 84, 084037 (arXiv:1107.1267; bibliographic data from memory), analytic fit to the zero-detuned high-power design curve",
    convention: "l_shaped",
    conventionNote: L_NOTE,
    fMin: 10,
    fMax: 8192,
    defaultFLow: 10,
    space: false,
    psd: aligoDesign,
  },
  {
    id: "aligo-o1",
    name: "LIGO Hanford, first observing run (fit)",
    source: "Yunes, Yagi & Pretorius 2016, Phys. Rev. D 94, 084002 (arXiv:1603.08955), App. C",
    convention: "l_shaped",
    conventionNote: L_NOTE,
    fMin: 20,
    fMax: 2000,
    defaultFLow: 20,
    space: false,
    psd: aligoO1,
  },
  {
    id: "et-b",
    name: "Einstein Telescope (ET-B)",
    source: "Mishra, Arun, Iyer & Sathyaprakash 2010, Phys. Rev. D 82, 064010 (arXiv:1005.0304; journal data from memory), analytic ET-B fit",
    convention: "triangle",
    conventionNote: "PSD of ONE 60-degree interferometer; the triangle of three is in the amplitude: SNR^2 = 9/4 of an L-shaped detector with the same PSD",
    fMin: 1,
    fMax: 10000,
    defaultFLow: 1,
    space: false,
    psd: etB,
  },
  {
    id: "lisa",
    name: "LISA",
    source: "Robson, Cornish & Liu 2019, Class. Quantum Grav. 36, 105011 (arXiv:1803.01944), Eqs. 1, 9-14 and Table 1 (galactic confusion for the observing time)",
    convention: "response_averaged",
    conventionNote: "sky- and polarisation-averaged response already inside the PSD (the 10/3): SNR^2 = (16/5) int |A|^2 / S_n df with the optimal-orientation amplitude",
    fMin: 1e-5,
    fMax: 1,
    defaultFLow: 1e-5,
    space: true,
    psd: (f, years) => lisaInstrument(f) + lisaConfusion(f, years),
  },
  {
    id: "tianqin",
    name: "TianQin",
    source: "Huang et al. 2020, Phys. Rev. D 102, 063021 (arXiv:2005.07889; bibliographic data from memory), Eq. 13, multiplied by 10/3; no galactic foreground",
    convention: "response_averaged",
    conventionNote: "multiplied by 10/3 so that it follows the same convention as the LISA curve (Huang et al. put the 10/3 into the waveform)",
    fMin: 1e-5,
    fMax: 1,
    defaultFLow: 1e-5,
    space: true,
    psd: tianqin,
  },
  {
    id: "decigo",
    name: "DECIGO (one triangle)",
    source: "Yagi & Seto 2011, Phys. Rev. D 83, 044011 (arXiv:1101.3940), Eq. 5; erratum Phys. Rev. D 95, 109901 (2017) (journal data from memory)",
    convention: "two_channel_triangle",
    conventionNote: "one triangle read as two independent 60-degree channels: SNR^2 = 2 x 3/4 of an L-shaped detector (derived convention; the full constellation has several triangles)",
    toConfirm: DECIGO_TO_CONFIRM,
    fMin: 1e-3,
    fMax: 100,
    defaultFLow: 1e-3,
    space: true,
    psd: decigo,
  },
  {
    id: "b-decigo",
    name: "B-DECIGO",
    source: "Isoyama, Nakano & Nakamura 2018, PTEP 2018, 073E01 (bibliographic data from memory)",
    convention: "two_channel_triangle",
    conventionNote: "read like DECIGO: two independent 60-degree channels, SNR^2 = 3/2 of an L-shaped detector (derived convention)",
    toConfirm: B_DECIGO_TO_CONFIRM,
    fMin: 1e-2,
    fMax: 100,
    defaultFLow: 1e-2,
    space: true,
    psd: bDecigo,
  },
];

export function builtInCurve(id: string): NoiseCurve | undefined {
  return BUILT_IN_CURVES.find((c) => c.id === id);
}

/** A tabulated curve (frequencies increasing, PSD values positive), interpolated linearly in log-log. */
export interface TabulatedCurve {
  readonly frequencies: readonly number[];
  readonly psd: readonly number[];
}

export function tabulatedPsd(table: TabulatedCurve): (f: number) => number {
  const lf = Float64Array.from(table.frequencies, Math.log);
  const ls = Float64Array.from(table.psd, Math.log);
  const n = lf.length;
  return (f: number) => {
    const x = Math.log(f);
    if (x <= lf[0]!) return Math.exp(ls[0]!);
    if (x >= lf[n - 1]!) return Math.exp(ls[n - 1]!);
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (lf[mid]! <= x) lo = mid;
      else hi = mid;
    }
    const t = (x - lf[lo]!) / (lf[hi]! - lf[lo]!);
    return Math.exp(ls[lo]! + t * (ls[hi]! - ls[lo]!));
  };
}
