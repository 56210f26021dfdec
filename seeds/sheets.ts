import { createSheetSchema, type CreateSheetRequest } from "../common/sheets.ts";
import type { Identity, Role } from "../server/http/identity.ts";
import { dbCatalogueReader } from "../server/features/convert/catalogue-reader.ts";
import { convertService } from "../server/features/convert/service.ts";
import { sheetsService } from "../server/features/sheets/service.ts";
import type { SeedStep } from "./index.ts";

/**
 * One saved sheet for the demo analyst. Everything in it is invented for the demo: the Kestrel-Vireo
 * detector network, the KV-... event labels, the bounds and the masses. It is translated through the
 * same service as a sheet saved from the page, against the catalogue seeded just before it.
 */
export const DEMO_SHEET: CreateSheetRequest = createSheetSchema.parse({
  name: "Demo: Kestrel-Vireo first-season bounds",
  description:
    "Invented demo data. Kestrel-Vireo is a fictional two-detector network and the KV- events are fictional; the bounds and masses were made up to show how a sheet reads. Do not cite.",
  records: [
    {
      label: "KV-231107a",
      detector_network: "Kestrel-Vireo (demo)",
      analysis_method: "ppE phase, one deviation at a time (demo)",
      data_link: "https://data.kestrel-vireo.example/events/KV-231107a",
      notes: "Unequal-mass black holes: the -1PN term is the interesting one.",
      bound: { parameter: "ppe_beta", b: -7, upper: 2.4e-3, credibility: 0.9, sign_convention: "plus" },
      binary: { m1: 10.3, m2: 6.1, chi1: 0.1, chi2: 0, bodies: ["bh", "bh"], frame: "detector", z: 0.12 },
    },
    {
      label: "KV-240322c",
      detector_network: "Kestrel-Vireo (demo)",
      analysis_method: "generalized-IMR coefficients (demo)",
      data_link: "https://data.kestrel-vireo.example/events/KV-240322c",
      notes: "",
      bound: { parameter: "gimr_dphi", k: -2, upper: 0.021, credibility: 0.9, includes_spin: false },
      binary: { m1: 12.4, m2: 6.8, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source", z: 0.09 },
    },
    {
      label: "KV-240815b",
      detector_network: "Kestrel-Vireo (demo)",
      analysis_method: "ppE phase at 1PN, propagation (demo)",
      data_link: "https://data.kestrel-vireo.example/events/KV-240815b",
      notes: "Heavier and farther: a propagation bound.",
      bound: { parameter: "ppe_beta", b: -3, upper: 0.031, credibility: 0.9, sign_convention: "plus" },
      binary: { m1: 31.5, m2: 26.2, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source", z: 0.31 },
    },
  ],
});

export const sheetsSeed: SeedStep = {
  name: "sheets",
  run: async (trx) => {
    const row = await trx("users").where({ login: "demo-analyst" }).first<{ id: number; login: string; name: string; roles: Role[] } | undefined>("id", "login", "name", "roles");
    if (!row) return; // no demo analyst: nothing to own the sheet
    const who: Identity = { id: row.id, login: row.login, name: row.name, roles: row.roles, via: "session" };
    // A transaction is a Knex: the sheet is written (and its catalogue read) inside the seed's transaction.
    await sheetsService(trx, convertService(dbCatalogueReader(trx))).create(who, DEMO_SHEET);
  },
};
