// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { boundSchema, convertRequestSchema } from "../../common/convert.ts";
import { sheetRecordInputSchema, type Sheet } from "../../common/sheets.ts";
import { asTranslation } from "../helpers/sheets.ts";
import { ExportLinks } from "../../client/features/sheets/components/export-links.tsx";
import { SheetRecords } from "../../client/features/sheets/components/sheet-records.tsx";
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
        kind: "translation",
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
        saved_at: "2026-12-01T00:00:00.000Z",
        entry_revisions: null,
        stale: null,
        history: [],
      },
    ],
  };
}

describe("<SheetRecords>", () => {
  it("when a record is shown, then its bound, provenance, limits with validity and the not-applicable reasons are there", () => {
    render(<SheetRecords sheet={sheetWithOneRecord()} />);
    const card = screen.getByTestId("record-OT-1");
    expect(card.textContent).toMatch(/\|β\| ≤ 0\.001 at b = -7, 90% credibility/);
    expect(card.textContent).toMatch(/√α ≤ 4\.07 km/);
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

  it("when a record input names no kind, then the shared schema reads it as a translation (older clients keep working)", () => {
    const r = asTranslation(sheetWithOneRecord().records[0]!);
    const input = sheetRecordInputSchema.parse({ label: r.label, bound: r.bound, binary: r.binary });
    expect(input.kind).toBe("translation");
  });

  it("when a record was translated against entries that changed since, then it is marked stale, keeps its result, and offers a re-translation", () => {
    const sheet = sheetWithOneRecord();
    const r = asTranslation(sheet.records[0]!);
    sheet.records[0] = { ...r, stale: { catalogue_revision: "15.16.zz", entries: [{ theory: "edgb", name: "Einstein-dilaton-Gauss-Bonnet gravity", was: 1, now: 2 }] } };
    const onRetranslate = vi.fn();
    render(<SheetRecords sheet={sheet} onRetranslate={onRetranslate} />);
    const note = screen.getByTestId("record-stale");
    expect(note.textContent).toMatch(/Einstein-dilaton-Gauss-Bonnet gravity \(revision 1 → revision 2\)/);
    expect(note.textContent).toMatch(/kept as it was/);
    // The stored limit is still what is shown.
    expect(screen.getByTestId("record-OT-1").textContent).toMatch(/√α ≤ 4\.07 km/);
    fireEvent.click(screen.getByTestId("retranslate-record"));
    expect(onRetranslate).toHaveBeenCalledWith(sheet.records[0]);
  });

  it("when a record has an earlier translation, then the history lists it with its catalogue version and limits", () => {
    const sheet = sheetWithOneRecord();
    const r = asTranslation(sheet.records[0]!);
    sheet.records[0] = { ...r, history: [{ translation: r.translation, translated_at: "2026-11-30T10:00:00.000Z", entry_revisions: null, replaced_at: "2026-12-01T00:00:00.000Z" }] };
    render(<SheetRecords sheet={sheet} />);
    const history = screen.getByTestId("record-history");
    expect(history.textContent).toMatch(/1 earlier translation/);
    expect(history.textContent).toMatch(/replaced/);
  });
});

describe("<ExportLinks>", () => {
  it("when rendered, then each format links to its export URL as a download", () => {
    render(<ExportLinks hrefFor={(f) => apiPaths.sheetExport(7, f)} />);
    expect(screen.getByTestId("export-latex").getAttribute("href")).toBe("/api/v1/sheets/7/export?format=latex");
    expect(screen.getByTestId("export-bibtex").hasAttribute("download")).toBe(true);
  });
});
