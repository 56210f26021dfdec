import Papa from "papaparse";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readBibtexReference } from "../../server/features/references/bibtex-read.ts";
import { readBibtexFile } from "../helpers/bibtex.ts";
import { sheetSchema, type Sheet } from "../../common/sheets.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { CSV_COLUMNS, escapeCsvCell } from "../../server/features/sheets/export-csv.ts";
import { escapeLatex, numberLatex, shortTheoryName } from "../../server/features/sheets/export-latex.ts";
import { fileStem } from "../../server/features/sheets/export-stem.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { translationOf } from "../helpers/sheets.ts";

describe("export formatting (pure)", () => {
  it("when numbers are written for LaTeX, then they read as a physicist writes them, with the requested figures", () => {
    // Common practice: plain between 1 and 1000, otherwise a mantissa times a power of ten.
    expect(numberLatex(5.51, 2)).toBe("5.5");
    expect(numberLatex(0.2793, 2)).toBe("2.8 \\times 10^{-1}");
    expect(numberLatex(4.0721, 3)).toBe("4.07");
    expect(numberLatex(123.4, 2)).toBe("120");
    expect(numberLatex(1e-3, 2)).toBe("1.0 \\times 10^{-3}");
    expect(numberLatex(1.2e-22, 2)).toBe("1.2 \\times 10^{-22}");
    expect(numberLatex(-2.5e13, 3)).toBe("-2.50 \\times 10^{13}");
    expect(numberLatex(7, 1)).toBe("7");
    expect(numberLatex(0)).toBe("0");
  });

  it("when a theory has a long name, then the table uses its abbreviation or drops the qualifier", () => {
    expect(shortTheoryName("Einstein-dilaton-Gauss-Bonnet gravity (linear, shift-symmetric coupling)", "edgb")).toBe("EdGB");
    expect(shortTheoryName("Dynamical Chern-Simons gravity", "dcs")).toBe("dCS");
    expect(shortTheoryName("Massive graviton (propagation)", "massive-graviton")).toBe("Massive graviton");
    expect(shortTheoryName("Randall-Sundrum II braneworld: black-hole mass loss", "extra-dimension")).toBe("Randall-Sundrum II braneworld");
    expect(shortTheoryName("Time-varying Newton constant", "varying-g")).toBe("Time-varying Newton constant");
  });

  it("when text holds LaTeX specials, then each is escaped for text mode", () => {
    expect(escapeLatex("KV_1 & 50% #2 {x} ~ ^ \\ $")).toBe("KV\\_1 \\& 50\\% \\#2 \\{x\\} \\textasciitilde{} \\textasciicircum{} \\textbackslash{} \\$");
  });

  it("when CSV cells hold commas, quotes or formula starts, then they are quoted or defused; numbers stay numbers", () => {
    expect(escapeCsvCell('a "b", c')).toBe('"a ""b"", c"');
    expect(escapeCsvCell("=HYPERLINK(1)")).toBe("'=HYPERLINK(1)");
    expect(escapeCsvCell(-7)).toBe("-7");
    expect(escapeCsvCell(null)).toBe("");
    expect(fileStem("Demo: Kestrel–Vireo bounds!")).toBe("demo-kestrel-vireo-bounds");
  });
});

describe("GET /api/v1/sheets/:id/export", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;
  let token: string;
  let sheet: Sheet;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
    await ensureUser(tdb.db, { login: "x-analyst", roles: ["analyst"] });
    token = `Bearer ${await bearerFor(tdb.db, "x-analyst")}`;
    const res = await request(app)
      .post("/api/v1/sheets")
      .set("Authorization", token)
      .send({
        name: "Egret & Crane 90% bounds",
        records: [
          {
            label: "EC-01_a",
            detector_network: "Egret-Crane (test)",
            analysis_method: "ppE",
            bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 },
            binary: { m1: 10, m2: 5, frame: "source" },
          },
          {
            label: "EC-02",
            detector_network: "Egret-Crane (test)",
            analysis_method: "ppE, propagation",
            bound: { parameter: "ppe_beta", b: -3, upper: 0.02, credibility: 0.9 },
            binary: { m1: 30, m2: 25, frame: "source", z: 0.2 },
          },
        ],
      });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    sheet = sheetSchema.parse(res.body);
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  const exportOf = (format: string) => request(app).get(`/api/v1/sheets/${sheet.id}/export?format=${format}`).set("Authorization", token);

  it("when the LaTeX table is exported, then it is a column-wide tabularx with one group per bound, marks with a legend, citations and a label", async () => {
    const res = await exportOf("latex");
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/application\/x-tex/);
    expect(res.headers["content-disposition"]).toBe('attachment; filename="egret-crane-90-bounds.tex"');
    const tex = res.text;
    const order = ["\\begin{table}", "\\caption{", "\\label{tab:egret-crane-90-bounds}", "\\begin{tabularx}{\\linewidth}", "\\toprule", "\\midrule", "\\bottomrule", "\\end{tabularx}", "\\end{table}"].map((s) => tex.indexOf(s));
    expect(order.every((i) => i >= 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    // Every record has the same credibility: stated once, in the caption.
    expect(tex).toMatch(/\\caption\{[^}]*at 90\\% credibility/);
    expect(tex).toContain("EC-01\\_a");
    expect(tex).toContain("Egret \\& Crane");
    // The bound is stated once per group, in a row spanning the table.
    expect(tex.match(/\\multicolumn\{5\}/g)).toHaveLength(2);
    expect(tex).toContain("$|\\beta| \\le 1.0 \\times 10^{-3}$ at $b = -7$");
    const edgb = translationOf(sheet.records[0]!).results.find((r) => r.theory === "edgb")!;
    // EdGB fails its small-coupling condition at this limit (16 pi alpha^2/m^4 > 1/6): marked not valid.
    expect(edgb.valid).toBe(false);
    const edgbRow = tex.split("\n").find((l) => l.trim().startsWith("EdGB &"))!;
    const cells = edgbRow.replace(/\\\\\s*$/, "").split(" & ").map((c) => c.trim());
    expect(cells[1]).toBe("$\\sqrt{\\alpha}$ [$\\mathrm{km}$]");
    expect(cells[2]).toBe(`$\\le ${numberLatex(edgb.coupling.value, 2)}$`);
    expect(cells[3]).toBe("$\\dagger$");
    expect(cells[4]).toBe(`\\cite{${edgb.references.map((r) => r.key).join(",")}}`);
    // The legend explains each mark that appears, and no code names or "dimensionless" units leak in.
    expect(tex).toMatch(/\$\\dagger\$~a validity condition fails/);
    for (const leak of ["sqrt_alpha", "B_dip", "dimensionless", "$$"]) expect(tex).not.toContain(leak);
    expect(tex).not.toMatch(/(?<!\\)lambda_g/);
    // Data rows: one per limit, each with the same number of cells as the header.
    const rows = tex.split("\n").filter((l) => l.trim().endsWith("\\\\") && !l.includes("\\multicolumn"));
    expect(new Set(rows.map((l) => l.split(" & ").length))).toEqual(new Set([5]));
    expect(rows.length - 1).toBe(sheet.records.reduce((n, r) => n + translationOf(r).results.length, 0));
  });

  it("when the BibTeX is exported, then it parses back and holds every reference the limits cite", async () => {
    const res = await exportOf("bibtex");
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/application\/x-bibtex/);
    const entries = readBibtexFile(res.text);
    const cited = new Set(sheet.records.flatMap((r) => translationOf(r).results.flatMap((x) => [...x.references.map((c) => c.key), ...x.reference_bounds.map((c) => c.reference.key)])));
    expect(new Set(entries.map((e) => e.key))).toEqual(cited);
    expect(cited.has("lyu-jiang-yagi-2022")).toBe(true);
    const lyuText = res.text.slice(res.text.indexOf("{lyu-jiang-yagi-2022,") - 9);
    const lyu = readBibtexReference(lyuText.slice(0, lyuText.indexOf("\n}\n") + 3));
    expect(lyu).toMatchObject({ key: "lyu-jiang-yagi-2022", year: 2022, arxiv: "2201.02543" });
    expect(lyu.authors.length).toBeGreaterThan(1);
  });

  it("when the CSV is exported, then it reads back with one row per record and theory, numbers intact", async () => {
    const res = await exportOf("csv");
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/text\/csv/);
    const parsed = Papa.parse<Record<string, string>>(res.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...CSV_COLUMNS]);
    const total = sheet.records.reduce((n, r) => n + translationOf(r).results.length + translationOf(r).not_applicable.length, 0);
    expect(parsed.data).toHaveLength(total);
    const edgb = parsed.data.find((r) => r.record === "EC-01_a" && r.theory === "edgb")!;
    const expected = translationOf(sheet.records[0]!).results.find((r) => r.theory === "edgb")!;
    // The symbol as a physicist writes it; the identifier of the same quantity in its own column for scripts.
    expect(edgb).toMatchObject({ status: "bounded", b: "-7", symbol: "√α", coupling_id: "sqrt_alpha", unit: "km", side: "upper", valid: "false" });
    // Thresholds as people write them (the EdGB regular-horizon condition is quoted as < 1/6), never 0.16666666666666666.
    expect(edgb.failed_conditions).toContain("> 1/6");
    for (const r of parsed.data) for (const text of [r.failed_conditions, r.also, r.reason]) expect(text ?? "").not.toMatch(/\d\.\d{6,}/);
    for (const leak of ["sqrt_alpha", "lambda_g", "B_dip"]) expect(parsed.data.every((r) => !(r.symbol ?? "").includes(leak) && !(r.also ?? "").includes(leak))).toBe(true);
    expect(Number(edgb.value)).toBe(expected.coupling.value);
    const mg = parsed.data.find((r) => r.record === "EC-02" && r.theory === "massive-graviton")!;
    expect(mg.symbol).toBe("λ_g");
    expect(mg.coupling_id).toBe("lambda_g");
    expect(mg.also).toMatch(/^m_g ≤ [0-9.]+ × 10⁻[⁰¹²³⁴⁵⁶⁷⁸⁹]+ eV$/);
    expect(parsed.data.some((r) => r.status === "not_applicable" && (r.reason ?? "").length > 0)).toBe(true);
  });

  it("when the JSON is exported, then it is the sheet with its translations and without the share token", async () => {
    await request(app).post(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", token).expect(201);
    const res = await exportOf("json");
    expect(res.status).toBe(200);
    const doc = JSON.parse(res.text);
    expect(doc).toMatchObject({ format: "dragoman-sheet", format_version: 2, sheet: { id: sheet.id, name: sheet.name } });
    expect(doc.sheet.share_token).toBeUndefined();
    expect(doc.sheet.records[1].translation.results[0].theory).toBe("massive-graviton");
  });

  it("when the format is unknown, then 400 names format", async () => {
    const res = await exportOf("pdf");
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["format"]);
  });

  it("when the sheet is shared, then anyone can export it through the token; without the token or role, no export", async () => {
    const share = await request(app).post(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", token);
    const res = await request(app).get(`/api/v1/shared/${share.body.token}/export?format=latex&digits=4`);
    expect(res.status).toBe(200);
    expect(res.text).toContain("\\toprule");
    expect(res.text).toMatch(/\$\\le \d\.\d{3}( \\times 10\^\{-?\d+\})?\$/);
    expect((await request(app).get(`/api/v1/sheets/${sheet.id}/export?format=csv`)).status).toBe(401);
  });
});
