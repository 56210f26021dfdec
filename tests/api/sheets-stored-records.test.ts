import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { toRecord } from "../../server/features/sheets/service.ts";
import type { SheetRecordRow } from "../../server/features/sheets/repository.ts";
import { seedCatalogue } from "./convert-fixture.ts";

/**
 * Records stored by the version of 2 December 2026 (one of each kind, arrays shortened) must stay
 * readable: a sheet keeps a result as computed, so a later change to a result's schema that made an
 * old record unreadable would break every sheet holding one. When this fails, make the new field
 * optional or give it a default rather than editing the fixture.
 */
describe("stored sheet records", () => {
  it("when records stored by an earlier version are read, then each kind parses through today's schemas", () => {
    const rows = JSON.parse(readFileSync("tests/api/fixtures/sheet-records-2026-12-02.json", "utf8")) as Record<string, unknown>[];
    expect(rows.map((r) => r.kind)).toEqual(["translation", "samples_job", "stack", "consistency", "consistency"]);
    const catalogue = seedCatalogue();
    const stamp = new Date("2026-12-02T10:00:00Z");
    const records = rows.map((row, i) => {
      const stored: SheetRecordRow = {
        id: i + 1,
        sheet_id: 1,
        position: i,
        label: `record ${i}`,
        detector_network: "",
        analysis_method: "",
        data_link: "",
        notes: "",
        kind: row.kind as SheetRecordRow["kind"],
        bound: row.kind === "translation" ? { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, sign_convention: "plus", f_low: 20 } : null,
        binary: row.kind === "translation" ? { m1: 10, m2: 5, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" } : null,
        cosmology: row.kind === "translation" ? { H0: 67.66, Omega_m: 0.3111 } : null,
        conventions: {},
        translation: row.translation,
        catalogue_revision: null,
        entry_revisions: (row.entry_revisions ?? null) as Record<string, number> | null,
        payload: row.payload,
        history: (row.history ?? []) as unknown[],
        translated_at: stamp,
        saved_at: stamp,
      };
      return toRecord(stored, catalogue);
    });
    expect(records.map((r) => r.kind)).toEqual(["translation", "samples_job", "stack", "consistency", "consistency"]);
  });

  it("when a ringdown record stored on 2 December 2026 is read, then it parses through today's schemas with its request and translation", () => {
    const [row] = JSON.parse(readFileSync("tests/api/fixtures/sheet-records-ringdown-2026-12-02.json", "utf8")) as Record<string, unknown>[];
    const stamp = new Date("2026-12-02T14:00:00Z");
    const record = toRecord(
      {
        id: 1,
        sheet_id: 1,
        position: 0,
        label: "ringdown",
        detector_network: "",
        analysis_method: "",
        data_link: "",
        notes: "",
        kind: "ringdown",
        bound: null,
        binary: null,
        cosmology: null,
        conventions: {},
        translation: row!.translation,
        catalogue_revision: null,
        entry_revisions: (row!.entry_revisions ?? null) as Record<string, number> | null,
        payload: row!.payload,
        history: (row!.history ?? []) as unknown[],
        translated_at: stamp,
        saved_at: stamp,
      },
      seedCatalogue(),
    );
    if (record.kind !== "ringdown") throw new Error(`read as ${record.kind}`);
    expect(record.request.bound).toMatchObject({ parameter: "qnm_dfreq", mode: "220", upper: 0.05 });
    expect(record.translation.results.find((r) => r.slug === "johannsen")?.upper?.value).toBeCloseTo(1.35, 10);
  });
});
