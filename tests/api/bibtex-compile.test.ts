import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { splitJournal } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { readBibtexFile } from "../helpers/bibtex.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { seedCatalogue } from "./catalogue-fixtures.ts";

// The whole literature of the seeded catalogue, exported as BibTeX, run through the real `bibtex`
// program (TeX Live, installed by scripts/test.sh) with the standard plain style: BibTeX's own
// semantics decide whether the fields are there and how many authors each entry has.

let tdb: TestDatabase;
let app: DragomanApp;
let dir: string;
beforeAll(async () => {
  tdb = await createTestDatabase();
  await seedCatalogue(tdb.db);
  app = buildTestApp(tdb);
  dir = mkdtempSync(join(tmpdir(), "dragoman-bib-"));
});
afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
  await tdb.drop();
});

describe("seeded references", () => {
  it("when a seed writes the journal as running text, then journal, volume, pages and an erratum note are stored apart", () => {
    expect(splitJournal("Phys. Rev. D 80, 122003")).toEqual({ journal: "Phys. Rev. D", volume: "80", pages: "122003" });
    expect(splitJournal("Phys. Rev. D 86, 081504(R)")).toEqual({ journal: "Phys. Rev. D", volume: "86", pages: "081504" });
    expect(splitJournal("JHEP 01 (2003) 079")).toEqual({ journal: "JHEP", volume: "01", pages: "079" });
    expect(splitJournal("Phys. Rev. D 85, 064022; erratum Phys. Rev. D 93, 029902 (2016)")).toEqual({
      journal: "Phys. Rev. D",
      volume: "85",
      pages: "064022",
      note: "Erratum: Phys. Rev. D 93, 029902 (2016)",
    });
  });
});

describe("GET /api/v1/references/bibtex (every seeded reference)", () => {
  it("when the export is run through bibtex with the plain style, then it reports no error or warning and every entry is an article with its fields", async () => {
    const list = await request(app).get("/api/v1/references");
    expect(list.status).toBe(200);
    const refs = list.body.references as { id: number; journal: string | null; volume: string | null; pages: string | null; authors: string[] }[];
    expect(refs.length).toBeGreaterThan(10);
    for (const r of refs) if (r.journal) expect(r.journal, "journal holds no volume or pages").not.toMatch(/\d+,\s*\d+/);
    const res = await request(app).get("/api/v1/references/bibtex").query({ ids: refs.map((r) => r.id).join(",") });
    expect(res.status).toBe(200);
    const entries = readBibtexFile(res.text);
    expect(entries).toHaveLength(refs.length);
    expect(new Set(entries.map((e) => e.key)).size).toBe(entries.length);
    for (const e of entries) {
      expect(e.type).toBe("article");
      expect(e.fields.journal, e.key).toBeTruthy();
      expect(e.fields.pages ?? e.fields.eid, e.key).toBeTruthy();
      if (e.fields.eprint) expect(e.fields.archiveprefix, e.key).toBe("arXiv");
    }
    expect([...res.text].filter((ch) => ch.charCodeAt(0) > 127)).toEqual([]);

    writeFileSync(join(dir, "refs.bib"), res.text);
    writeFileSync(join(dir, "paper.aux"), `\\relax\n\\bibstyle{plain}\n\\bibdata{refs}\n${entries.map((e) => `\\citation{${e.key}}`).join("\n")}\n`);
    let log: string;
    try {
      log = execFileSync("bibtex", ["paper"], { cwd: dir, encoding: "utf8" });
    } catch (err) {
      const out = (err as { stdout?: string }).stdout ?? "";
      throw new Error(`bibtex failed:\n${out}`, { cause: err });
    }
    expect(log).not.toMatch(/Warning--|error message/);
    const bbl = readFileSync(join(dir, "paper.bbl"), "utf8");
    expect(bbl.match(/\\bibitem/g)).toHaveLength(entries.length);
  });

  it("when a collaboration is among the authors, then bibtex prints it as one author, not split into first and last names", async () => {
    writeFileSync(
      join(dir, "collab.bib"),
      (await import("../../common/bibtex.ts")).formatBibtexReference({ key: "lvc", authors: ["LIGO Scientific Collaboration", "Virgo Collaboration"], title: "Tests of general relativity with GW150914", year: 2016, journal: "Phys. Rev. Lett.", volume: "116", pages: "221101" }),
    );
    writeFileSync(join(dir, "collab.aux"), "\\relax\n\\bibstyle{plain}\n\\bibdata{collab}\n\\citation{lvc}\n");
    execFileSync("bibtex", ["collab"], { cwd: dir, encoding: "utf8" });
    const bbl = readFileSync(join(dir, "collab.bbl"), "utf8").replace(/\s+/g, " ");
    // plain.bst abbreviates first names; an unprotected "LIGO Scientific Collaboration" would come out as "L. S. Collaboration".
    expect(bbl).toContain("{LIGO Scientific Collaboration} and {Virgo Collaboration}");
  });
});
