/**
 * Literature cited by the second batch of catalogue entries, in the submission shape (authors as a
 * list, journal, volume and pages apart). Details marked `details_from_memory` were written without
 * re-reading the paper's front page: an editor checks them before the entry is called reviewed.
 */
import type { ReferenceInput } from "../../common/catalogue.ts";
import { splitJournal } from "../catalogue.ts";
import { REFS } from "./references.ts";
import type { ReferenceEntry } from "./theory-entry.ts";

/** A reference of the first batch (authors as one comma-separated string) in the submission shape. */
export function asInput(r: ReferenceEntry): ReferenceInput & { key: string } {
  return {
    ...r,
    ...(r.journal ? splitJournal(r.journal) : {}),
    authors: r.authors
      .split(/,\s+/)
      .map((a) => a.trim())
      .filter(Boolean),
  };
}

export const FIRST = {
  mirshekari: asInput(REFS.mirshekariYunesWill2012),
  lvkGwtc3: asInput(REFS.lvk2021Gwtc3Tgr),
  will1998: asInput(REFS.will1998),
  yyp2016: asInput(REFS.yunesYagiPretorius2016),
  tahuraYagi: asInput(REFS.tahuraYagi2018),
  yps2010: asInput(REFS.yunesPretoriusSpergel2010),
  lyu2022: asInput(REFS.lyuJiangYagi2022),
  will1994: asInput(REFS.will1994),
} as const;

export const WAVE2_REFS = {
  gw170817Grb: {
    key: "lvc-fermi-integral-2017",
    arxiv: "1710.05834",
    doi: "10.3847/2041-8213/aa920c",
    authors: ["LIGO Scientific Collaboration", "Virgo Collaboration", "Fermi Gamma-ray Burst Monitor", "INTEGRAL"],
    title: "Gravitational waves and gamma-rays from a binary neutron star merger: GW170817 and GRB 170817A",
    year: 2017,
    journal: "Astrophys. J. Lett.",
    volume: "848",
    pages: "L13",
    locator: "Sec. 4.1: -3e-15 <= (v_GW - c)/c <= +7e-16",
    details_from_memory: true,
  },
  nordtvedt1990: {
    key: "nordtvedt-1990",
    doi: "10.1103/PhysRevLett.65.953",
    authors: ["K. Nordtvedt"],
    title: "Gdot/G and a cosmological acceleration of gravitationally compact bodies",
    year: 1990,
    journal: "Phys. Rev. Lett.",
    volume: "65",
    pages: "953",
    locator: "orbital-period change of a binary of compact bodies with sensitivities under a varying G",
    details_from_memory: true,
  },
  hofmannMuller2018: {
    key: "hofmann-muller-2018",
    doi: "10.1088/1361-6382/aa8f7a",
    authors: ["F. Hofmann", "J. Müller"],
    title: "Relativistic tests with lunar laser ranging",
    year: 2018,
    journal: "Class. Quantum Grav.",
    volume: "35",
    pages: "035015",
    details_from_memory: true,
  },
  cardosoMacedoPaniFerrari2016: {
    key: "cardoso-macedo-pani-ferrari-2016",
    arxiv: "1604.07845",
    authors: ["V. Cardoso", "C. F. B. Macedo", "P. Pani", "V. Ferrari"],
    title: "Black holes and gravitational waves in models of minicharged dark matter",
    year: 2016,
    journal: "J. Cosmol. Astropart. Phys.",
    volume: "05",
    pages: "054",
    details_from_memory: true,
  },
  julieBerti2019: {
    key: "julie-berti-2019",
    arxiv: "1909.05258",
    authors: ["F.-L. Julié", "E. Berti"],
    title: "Post-Newtonian dynamics and black hole thermodynamics in Einstein-scalar-Gauss-Bonnet gravity",
    year: 2019,
    journal: "Phys. Rev. D",
    volume: "100",
    pages: "104061",
    details_from_memory: true,
  },
  krishnendu2017: {
    key: "krishnendu-arun-mishra-2017",
    arxiv: "1701.06318",
    authors: ["N. V. Krishnendu", "K. G. Arun", "C. K. Mishra"],
    title: "Testing the binary black hole nature of a compact binary coalescence",
    year: 2017,
    journal: "Phys. Rev. Lett.",
    volume: "119",
    pages: "091101",
    locator: "spin-induced quadrupole coefficients kappa_i in the 2PN phase",
    details_from_memory: true,
  },
  poisson1998: {
    key: "poisson-1998",
    arxiv: "gr-qc/9709032",
    authors: ["E. Poisson"],
    title: "Gravitational waves from inspiraling compact binaries: the quadrupole-moment term",
    year: 1998,
    journal: "Phys. Rev. D",
    volume: "57",
    pages: "5287",
    details_from_memory: true,
  },
  glampedakisBabak2006: {
    key: "glampedakis-babak-2006",
    arxiv: "gr-qc/0510057",
    authors: ["K. Glampedakis", "S. Babak"],
    title: "Mapping spacetimes with LISA: inspiral of a test body in a 'quasi-Kerr' field",
    year: 2006,
    journal: "Class. Quantum Grav.",
    volume: "23",
    pages: "4167",
    locator: "quadrupole Q = -M (a^2 + epsilon M^2)",
    details_from_memory: true,
  },
  damourEspositoFarese1993: {
    key: "damour-esposito-farese-1993",
    doi: "10.1103/PhysRevLett.70.2220",
    authors: ["T. Damour", "G. Esposito-Farèse"],
    title: "Nonperturbative strong-field effects in tensor-scalar theories of gravitation",
    year: 1993,
    journal: "Phys. Rev. Lett.",
    volume: "70",
    pages: "2220",
    details_from_memory: true,
  },
  damourEspositoFarese1996: {
    key: "damour-esposito-farese-1996",
    arxiv: "gr-qc/9602056",
    authors: ["T. Damour", "G. Esposito-Farèse"],
    title: "Tensor-scalar gravity and binary-pulsar experiments",
    year: 1996,
    journal: "Phys. Rev. D",
    volume: "54",
    pages: "1474",
    locator: "dipole flux proportional to (alpha_A - alpha_B)^2",
    details_from_memory: true,
  },
  flanaganHinderer2008: {
    key: "flanagan-hinderer-2008",
    arxiv: "0709.1915",
    authors: ["É. É. Flanagan", "T. Hinderer"],
    title: "Constraining neutron-star tidal Love numbers with gravitational-wave detectors",
    year: 2008,
    journal: "Phys. Rev. D",
    volume: "77",
    pages: "021502",
    details_from_memory: true,
  },
  vinesFlanaganHinderer2011: {
    key: "vines-flanagan-hinderer-2011",
    arxiv: "1101.1673",
    authors: ["J. Vines", "É. É. Flanagan", "T. Hinderer"],
    title: "Post-1-Newtonian tidal effects in the gravitational waveform from binary inspirals",
    year: 2011,
    journal: "Phys. Rev. D",
    volume: "83",
    pages: "084051",
    details_from_memory: true,
  },
  cardosoEtAl2017: {
    key: "cardoso-franzin-maselli-pani-raposo-2017",
    arxiv: "1701.01116",
    authors: ["V. Cardoso", "E. Franzin", "A. Maselli", "P. Pani", "G. Raposo"],
    title: "Testing strong-field gravity with tidal Love numbers",
    year: 2017,
    journal: "Phys. Rev. D",
    volume: "95",
    pages: "084014",
    details_from_memory: true,
  },
  deRham2017: {
    key: "de-rham-deskins-tolley-zhou-2017",
    arxiv: "1606.08462",
    authors: ["C. de Rham", "J. T. Deskins", "A. J. Tolley", "S.-Y. Zhou"],
    title: "Graviton mass bounds",
    year: 2017,
    journal: "Rev. Mod. Phys.",
    volume: "89",
    pages: "025004",
    details_from_memory: true,
  },
  bernus2019: {
    key: "bernus-et-al-2019",
    arxiv: "1901.04307",
    authors: ["L. Bernus", "O. Minazzoli", "A. Fienga", "M. Gastineau", "J. Laskar", "P. Deram"],
    title: "Constraining the mass of the graviton with the planetary ephemeris INPOP",
    year: 2019,
    journal: "Phys. Rev. Lett.",
    volume: "123",
    pages: "161103",
    details_from_memory: true,
  },
} satisfies Record<string, ReferenceInput>;

/** Every reference the second batch may cite, for `defineEntry`. */
export const WAVE2_LIBRARY = [...Object.values(FIRST), ...Object.values(WAVE2_REFS)];
