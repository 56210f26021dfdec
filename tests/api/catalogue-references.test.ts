import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { formatBibtexFile, formatBibtexReference, latexToText, parseBibtexEntries, parseBibtexReference, splitAuthors } from "../../common/bibtex.ts";
import { arxivIdSchema, doiSchema } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { upsertLiterature } from "../../server/features/references/repository.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { seedCatalogue } from "./catalogue-fixtures.ts";

// A BibTeX record in the style journals and INSPIRE hand out (fields as commonly exported; common practice).
const INSPIRE_STYLE = `
% exported by hand
@string{prd = "Phys. Rev. D"}
@Article{Berti:2005ys,
    author = "Berti, Emanuele and Cardoso, Vitor and Will, Clifford M.",
    title = "{On gravitational-wave spectroscopy of massive black holes with the space interferometer {LISA}}",
    eprint = "gr-qc/0512160",
    archivePrefix = "arXiv",
    doi = "10.1103/PhysRevD.73.064030",
    journal = prd,
    volume = "73",
    pages = "064030",
    year = "2006",
    month = mar
}`;

describe("common/bibtex.ts", () => {
  it("when given a journal-style record with a macro and quotes, then every field lands in the reference", () => {
    expect(parseBibtexReference(INSPIRE_STYLE)).toEqual({
      key: "Berti:2005ys",
      authors: ["Berti, Emanuele", "Cardoso, Vitor", "Will, Clifford M."],
      title: "On gravitational-wave spectroscopy of massive black holes with the space interferometer LISA",
      year: 2006,
      arxiv: "gr-qc/0512160",
      doi: "10.1103/PhysRevD.73.064030",
      journal: "Phys. Rev. D",
      volume: "73",
      pages: "064030",
    });
  });

  it("when accents, escapes, braces and # concatenation appear, then plain Unicode text comes out", () => {
    expect(latexToText(`Sch{\\"o}n, J{\\'e}r{\\^o}me \\& {\\o}ster -- \\c{c}a`)).toBe("Schön, Jérôme & øster -- ça");
    expect(latexToText("Mass of $\\alpha^2$ {GW}")).toBe("Mass of $\\alpha^2$ GW");
    const [e] = parseBibtexEntries(`@misc{k, title = "Part one, " # {part two}, author={A}, year=2020}`);
    expect(e?.fields.title).toBe("Part one, part two");
    expect(splitAuthors("{LIGO Scientific and Virgo Collaborations} and Doe, J.")).toEqual(["LIGO Scientific and Virgo Collaborations", "Doe, J."]);
  });

  it("when a reference is written and read back, then it is unchanged (print -> parse round trip)", () => {
    const refs = [
      parseBibtexReference(INSPIRE_STYLE),
      { key: "odd_key:1", authors: ["Ünal, Ç.", "{Braced} Name", "Corp and Sons"], title: "50% of {x} & y_z with $\\beta_{ppE}$", year: 1999, note: "a # note" },
      { authors: ["K. Yagi"], title: "A preprint", year: 2012, arxiv: "1204.4524v2" },
    ];
    for (const r of refs) {
      const again = parseBibtexReference(formatBibtexReference(r));
      expect(again).toEqual({ ...r, key: r.key ?? again.key });
    }
  });

  it("when a set shares a citation key, then the file keeps keys unique", () => {
    const file = formatBibtexFile([
      { key: "yagi2012", authors: ["K. Yagi"], title: "One", year: 2012 },
      { key: "yagi2012", authors: ["K. Yagi"], title: "Two", year: 2012 },
    ]);
    expect(parseBibtexEntries(file).map((e) => e.key)).toEqual(["yagi2012", "yagi2012b"]);
  });

  it("when 'et al.' ends an author list, then BibTeX gets 'and others'", () => {
    expect(formatBibtexReference({ authors: ["E. M. Sänger et al."], title: "T", year: 2024 })).toContain("author = {E. M. Sänger and others}");
  });

  it("when the text is broken, then the error names the field", () => {
    expect(() => parseBibtexReference("@article{k, title = {Open")).toThrow(/not closed/);
    expect(() => parseBibtexReference("@article{k, title = {T}, year = 2020}")).toThrow(expect.objectContaining({ field: "author" }));
    expect(() => parseBibtexReference("@article{k, author = {A}, title = {T}, year = {next year}}")).toThrow(expect.objectContaining({ field: "year" }));
    expect(() => parseBibtexReference("no entry here")).toThrow(expect.objectContaining({ field: "bibtex" }));
  });

  it("when identifiers are checked, then new- and old-style arXiv ids and DOIs pass and malformed ones fail", () => {
    // Formats per arXiv's identifier scheme (YYMM.NNNNN since 2015, archive/YYMMNNN before 2007) and the DOI handbook (10.<registrant>/<suffix>).
    for (const ok of ["2104.11189", "0909.3328", "2104.11189v3", "gr-qc/0512160", "hep-th/0212132", "math.DG/0211159"]) expect(arxivIdSchema.safeParse(ok).success, ok).toBe(true);
    for (const bad of ["arXiv:2104.11189", "2104.1", "21041.1189", "gr-qc/05121", "GR-QC/0512160", "https://arxiv.org/abs/2104.11189"]) expect(arxivIdSchema.safeParse(bad).success, bad).toBe(false);
    for (const ok of ["10.1103/PhysRevD.80.122003", "10.1088/1126-6708/2003/01/079"]) expect(doiSchema.safeParse(ok).success, ok).toBe(true);
    for (const bad of ["doi:10.1103/PhysRevD.80.122003", "10.11/x", "10.1103/", "https://doi.org/10.1103/X", "10.1103/Phys Rev"]) expect(doiSchema.safeParse(bad).success, bad).toBe(false);
  });
});

let tdb: TestDatabase;
let app: DragomanApp;
beforeAll(async () => {
  tdb = await createTestDatabase();
  await seedCatalogue(tdb.db);
  app = buildTestApp(tdb);
});
afterAll(async () => {
  await tdb.drop();
});

describe("POST /api/v1/references/parse-bibtex", () => {
  it("when the entry is well formed, then 200 with the reference in the submission's shape", async () => {
    const res = await request(app).post("/api/v1/references/parse-bibtex").send({ bibtex: INSPIRE_STYLE });
    expect(res.status).toBe(200);
    expect(res.body).toEqual(parseBibtexReference(INSPIRE_STYLE));
  });

  it("when the arXiv id or DOI is malformed, then 400 naming that field", async () => {
    const arxiv = await request(app).post("/api/v1/references/parse-bibtex").send({ bibtex: INSPIRE_STYLE.replace("gr-qc/0512160", "gr-qc/05") });
    expect(arxiv.status).toBe(400);
    expect(Object.keys(arxiv.body.error.fields)).toEqual(["arxiv"]);
    expect(arxiv.body.error.message).toContain("arxiv");
    const doi = await request(app).post("/api/v1/references/parse-bibtex").send({ bibtex: INSPIRE_STYLE.replace("10.1103/PhysRevD.73.064030", "PhysRevD.73.064030") });
    expect(doi.status).toBe(400);
    expect(Object.keys(doi.body.error.fields)).toEqual(["doi"]);
  });

  it("when a required field is missing or the body is empty, then 400 naming it", async () => {
    const noTitle = await request(app).post("/api/v1/references/parse-bibtex").send({ bibtex: "@article{k, author={A. B.}, year={2020}}" });
    expect(noTitle.status).toBe(400);
    expect(noTitle.body.error.fields).toHaveProperty("title");
    const empty = await request(app).post("/api/v1/references/parse-bibtex").send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty("bibtex");
  });
});

describe("GET /api/v1/references/bibtex", () => {
  it("when ids are given, then their BibTeX, which parses back to the stored references (export -> parse round trip)", async () => {
    const list = await request(app).get("/api/v1/references");
    expect(list.status).toBe(200);
    const refs = list.body.references as { id: number; arxiv: string | null; doi: string | null; title: string; year: number; authors: string[] }[];
    expect(refs.length).toBeGreaterThan(5);
    const chosen = refs.filter((r) => r.arxiv || r.doi).slice(0, 4);
    const res = await request(app).get("/api/v1/references/bibtex").query({ ids: chosen.map((r) => r.id).join(",") });
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toContain("application/x-bibtex");
    const entries = res.text.split(/\n(?=@)/);
    expect(entries).toHaveLength(chosen.length);
    entries.forEach((text, i) => {
      const back = parseBibtexReference(text);
      const r = chosen[i];
      expect(back.title).toBe(r?.title);
      expect(back.year).toBe(r?.year);
      expect(back.arxiv ?? null).toBe(r?.arxiv);
      expect(back.doi ?? null).toBe(r?.doi);
    });
  });

  it("when a parsed entry is stored, exported and parsed again, then it is the same reference (parse -> export -> parse)", async () => {
    const parsed = (await request(app).post("/api/v1/references/parse-bibtex").send({ bibtex: INSPIRE_STYLE })).body;
    await tdb.db.transaction((trx) => upsertLiterature(trx, parsed));
    const stored = (await request(app).get("/api/v1/references")).body.references.find((r: { doi: string }) => r.doi === parsed.doi);
    const exported = await request(app).get("/api/v1/references/bibtex").query({ ids: String(stored.id) });
    const again = (await request(app).post("/api/v1/references/parse-bibtex").send({ bibtex: exported.text })).body;
    expect(again).toEqual(parsed);
  });

  it("when ids are missing, malformed or unknown, then 400 naming ids, or 404", async () => {
    const none = await request(app).get("/api/v1/references/bibtex");
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toHaveProperty("ids");
    const bad = await request(app).get("/api/v1/references/bibtex").query({ ids: "1,x" });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)[0]).toMatch(/^ids/);
    const unknown = await request(app).get("/api/v1/references/bibtex").query({ ids: "999999" });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toContain("999999");
  });
});
