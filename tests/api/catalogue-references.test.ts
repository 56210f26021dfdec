import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { formatBibtexFile, formatBibtexReference, isCorporateAuthor } from "../../common/bibtex.ts";
import { arxivIdSchema, doiSchema } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { readBibtexReference } from "../../server/features/references/bibtex-read.ts";
import { upsertLiterature } from "../../server/features/references/repository.ts";
import { readBibtexFile } from "../helpers/bibtex.ts";
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

describe("reading BibTeX (server/features/references/bibtex-read.ts, @retorquere/bibtex-parser)", () => {
  it("when given a journal-style record with a macro and quotes, then every field lands in the reference", () => {
    expect(readBibtexReference(INSPIRE_STYLE)).toEqual({
      key: "Berti:2005ys",
      authors: ["Emanuele Berti", "Vitor Cardoso", "Clifford M. Will"],
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
    const r = readBibtexReference(
      `@article{k, author = {Sch{\\"o}n, J{\\'e}r{\\^o}me and {\\O}ster, Fran{\\c{c}}ois and {LIGO Scientific and Virgo Collaborations}}, title = "Part one, " # {part \\emph{two} \\& 50\\%}, year = 2020}`,
    );
    expect(r.authors).toEqual(["Jérôme Schön", "François Øster", "LIGO Scientific and Virgo Collaborations"]);
    expect(r.title).toBe("Part one, part two & 50%");
  });

  it("when an author list ends in 'and others', then it reads as 'et al.'", () => {
    expect(readBibtexReference("@article{k, author = {Yagi, Kent and others}, title = {T}, year = 2012}").authors).toEqual(["Kent Yagi et al."]);
  });

  it("when the text is broken, then the error names the field", () => {
    expect(() => readBibtexReference("@article{k, title = {Open")).toThrow(expect.objectContaining({ field: "bibtex" }));
    expect(() => readBibtexReference("@article{k, title = {T}, year = 2020}")).toThrow(expect.objectContaining({ field: "author" }));
    expect(() => readBibtexReference("@article{k, author = {A}, title = {T}, year = {next year}}")).toThrow(expect.objectContaining({ field: "year" }));
    expect(() => readBibtexReference("no entry here")).toThrow(expect.objectContaining({ field: "bibtex" }));
    expect(() => readBibtexReference("@article{a, author={A}, title={T}, year=2020}\n@article{b, author={B}, title={U}, year=2021}")).toThrow(/one at a time/);
  });
});

describe("writing BibTeX (common/bibtex.ts)", () => {
  it("when a reference is written and read back, then it is unchanged (print -> parse round trip)", () => {
    const refs = [
      readBibtexReference(INSPIRE_STYLE),
      { key: "odd_key:1", authors: ["Çağrı Ünal", "Jérôme Schön", "Corp and Sons"], title: "50% of x & y_z", year: 1999, journal: "Phys. Rev. D", volume: "9", pages: "1-12", note: "a # note" },
      { key: "y12", authors: ["K. Yagi"], title: "A preprint", year: 2012, arxiv: "1204.4524v2" },
    ];
    for (const r of refs) {
      const again = readBibtexReference(formatBibtexReference(r));
      expect(again).toEqual(r);
    }
  });

  it("when exported, then every entry is an @article with journal, volume, pages or eid, doi, eprint and archivePrefix", () => {
    const [entry] = readBibtexFile(formatBibtexReference(readBibtexReference(INSPIRE_STYLE)));
    expect(entry?.type).toBe("article");
    expect(entry?.fields).toMatchObject({ journal: "Phys. Rev. D", volume: "73", pages: "064030", eid: "064030", doi: "10.1103/PhysRevD.73.064030", eprint: "gr-qc/0512160", archiveprefix: "arXiv" });
    // An e-print without a journal: journal "arXiv e-prints" and the id as eid (the form astrophysics data services export; common practice).
    const [preprint] = readBibtexFile(formatBibtexReference({ key: "p", authors: ["K. Yagi"], title: "A preprint", year: 2012, arxiv: "1204.4524" }));
    expect(preprint?.type).toBe("article");
    expect(preprint?.fields).toMatchObject({ journal: "arXiv e-prints", eid: "arXiv:1204.4524", eprint: "1204.4524", archiveprefix: "arXiv" });
    // Page ranges stay pages, with BibTeX's en dash.
    expect(formatBibtexReference({ key: "r", authors: ["A. B"], title: "T", year: 2000, journal: "Nature", volume: "425", pages: "374-376" })).toContain("pages = {374--376}");
  });

  it("when a collaboration is an author, then it is one brace-protected author", () => {
    const text = formatBibtexReference({ key: "c", authors: ["LIGO Scientific Collaboration", "Virgo Collaboration", "B. P. Abbott"], title: "T", year: 2016 });
    expect(text).toContain("author = {{LIGO Scientific Collaboration} and {Virgo Collaboration} and B. P. Abbott}");
    const [entry] = readBibtexFile(text);
    expect(entry?.fields.author).toEqual([{ name: "LIGO Scientific Collaboration" }, { name: "Virgo Collaboration" }, { firstName: "B. P.", lastName: "Abbott" }]);
    expect(isCorporateAuthor("K. Yagi")).toBe(false);
  });

  it("when non-ASCII letters appear, then they are written as LaTeX accents that read back to the same letters", () => {
    const text = formatBibtexReference({ key: "u", authors: ["E. M. Sänger", "Łukasz Øster"], title: "α and β in ∼ 2 cases", year: 2024 });
    expect(text).toMatch(/S\{\\"a\}nger/);
    expect([...text].filter((ch) => ch.charCodeAt(0) > 127)).toEqual([]);
    expect(readBibtexReference(text).authors).toEqual(["E. M. Sänger", "Łukasz Øster"]);
  });

  it("when a set holds the same paper twice or two papers share a key, then keys are unique and do not depend on the order", () => {
    const one = { key: "yagi2012", authors: ["K. Yagi"], title: "One", year: 2012, doi: "10.1/a" };
    const two = { key: "yagi2012", authors: ["K. Yagi"], title: "Two", year: 2012, doi: "10.1/b" };
    const keysOf = (refs: typeof one[]) => Object.fromEntries(readBibtexFile(formatBibtexFile(refs)).map((e) => [e.fields.title, e.key]));
    expect(keysOf([one, two])).toEqual({ One: "yagi2012", Two: "yagi2012b" });
    expect(keysOf([two, one, two])).toEqual({ One: "yagi2012", Two: "yagi2012b" });
    expect(readBibtexFile(formatBibtexFile([one, one]))).toHaveLength(1);
  });

  it("when 'et al.' ends an author list, then BibTeX gets 'and others'", () => {
    expect(formatBibtexReference({ authors: ["E. M. Sanger et al."], title: "T", year: 2024 })).toContain("author = {E. M. Sanger and others}");
  });
});

describe("reference input (common/theory-entry.ts)", () => {
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
    expect(res.body).toEqual(readBibtexReference(INSPIRE_STYLE));
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
      const back = readBibtexReference(text);
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
