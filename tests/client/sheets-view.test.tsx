// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { boundSchema, convertRequestSchema } from "../../common/convert.ts";
import { sheetRecordInputSchema, type Sheet } from "../../common/sheets.ts";
import { ExportLinks } from "../../client/features/sheets/components/export-links.tsx";
import { SheetRecords } from "../../client/features/sheets/components/sheet-records.tsx";
import { recordInput } from "../../client/features/sheets/lib/record-input.ts";
import { apiPaths } from "../../client/lib/paths.ts";
import { translate } from "../../server/features/convert/translate.ts";
import { seedCatalogue } from "../api/convert-fixture.ts";

afterEach(cleanup);

function sheetWithOneRecord(): Sheet {
  const req = convertRequestSchema.parse({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
  return {
    id: 7,
    name: "Osprey-Teal (test)",
    description: "",
    version: 3,
    owner: { login: "t", name: "T" },
    created_at: "2026-12-01T00:00:00.000Z",
    updated_at: "2026-12-01T00:00:00.000Z",
    share_token: null,
    records: [
      {
        id: 11,
        position: 0,
        label: "OT-1",
        detector_network: "Osprey-Teal (test)",
        analysis_method: "ppE",
        data_link: "https://data.osprey-teal.example/OT-1",
        notes: "",
        bound: boundSchema.parse(req.bound),
        binary: req.binary,
        cosmology: { H0: 67.66, Omega_m: 0.3111 },
        conventions: {},
        translation: translate(seedCatalogue(), req),
        translated_at: "2026-12-01T00:00:00.000Z",
      },
    ],
  };
}

describe("<SheetRecords>", () => {
  it("when a record is shown, then its bound, provenance, limits with validity and the not-applicable reasons are there", () => {
    render(<SheetRecords sheet={sheetWithOneRecord()} />);
    const card = screen.getByTestId("record-OT-1");
    expect(card.textContent).toMatch(/\|β\| ≤ 0\.001 at b = -7, 90% credibility/);
    expect(card.textContent).toMatch(/sqrt_alpha ≤ 4\.07 km/);
    expect(card.textContent).toMatch(/not valid/);
    expect(card.textContent).toMatch(/theories not constrained, and why/);
    expect(screen.queryByRole("button", { name: "Remove record" })).toBeNull();
  });

  it("when the owner removes a record, then the page is told which one", () => {
    const onRemove = vi.fn();
    const sheet = sheetWithOneRecord();
    render(<SheetRecords sheet={sheet} onRemove={onRemove} />);
    fireEvent.click(screen.getByRole("button", { name: "Remove record" }));
    expect(onRemove).toHaveBeenCalledWith(sheet.records[0]);
  });

  it("when a stored record is turned back into input, then the shared schema accepts it unchanged", () => {
    const input = recordInput(sheetWithOneRecord().records[0]!);
    expect(sheetRecordInputSchema.parse(input)).toEqual(input);
  });
});

describe("<ExportLinks>", () => {
  it("when rendered, then each format links to its export URL as a download", () => {
    render(<ExportLinks hrefFor={(f) => apiPaths.sheetExport(7, f)} />);
    expect(screen.getByTestId("export-latex").getAttribute("href")).toBe("/api/v1/sheets/7/export?format=latex");
    expect(screen.getByTestId("export-bibtex").hasAttribute("download")).toBe(true);
  });
});
