/**
 * The second batch of catalogue entries (submission shape), published once by the seed step
 * "catalogue-wave2" (seeds/catalogue-wave2.ts), so that a database seeded before they existed gains
 * them on its next start.
 */
import type { TheoryEntryInput } from "../../common/catalogue.ts";
import { ecoTidal, quasiKerrQuadrupole, scalarCharges, scalarGaussBonnetGeneral, scalarizedNeutronStar, spinInducedQuadrupole, varyingGSensitivities, vectorCharges } from "./theories-wave2-generation.ts";
import { einsteinAether, massiveScalarTensor, massiveVectorCharges } from "./theories-wave2-preferred-frame.ts";
import { dispersionA35, gwSpeed, massiveGravitonTwoOrders } from "./theories-wave2-propagation.ts";

export const THEORIES_WAVE2: readonly TheoryEntryInput[] = [
  dispersionA35,
  gwSpeed,
  massiveGravitonTwoOrders,
  varyingGSensitivities,
  vectorCharges,
  scalarCharges,
  scalarGaussBonnetGeneral,
  scalarizedNeutronStar,
  spinInducedQuadrupole,
  quasiKerrQuadrupole,
  ecoTidal,
];

/** Entries written after the batch above was seeded, published by their own step ("catalogue-wave2-b"). */
export const THEORIES_WAVE2_B: readonly TheoryEntryInput[] = [einsteinAether, massiveScalarTensor];

/** Written after "catalogue-wave2-b" had run on existing databases: a step of its own ("catalogue-wave2-c"). */
export const THEORIES_WAVE2_C: readonly TheoryEntryInput[] = [massiveVectorCharges];
