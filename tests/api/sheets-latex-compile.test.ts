import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readBibtexFile } from "../helpers/bibtex.ts";
import { sheetSchema, type Sheet } from "../../common/sheets.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { consistencyJob, GAUSSIAN_SUMMARIES, samplesJob, stackJob } from "../helpers/sheet-jobs.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { translationOf } from "../helpers/sheets.ts";

/**
 * The LaTeX export compiled for real with pdflatex and bibtex (Debian's texlive, installed by
 * scripts/test.sh when missing), in a one-column and a two-column article: it must compile without
 * errors, every \cite{} key must resolve against the BibTeX export, and no box may stick out of the
 * page by more than 1 pt.
 */

function run(cmd: string, args: string[], cwd: string) {
  const r = spawnSync(cmd, args, { cwd, encoding: "utf8" });
  if (r.error) throw new Error(`${cmd} could not run (${r.error.message}); scripts/test.sh installs texlive`);
  return r;
}

/** Compiles the table in an article and returns the final log. */
function compile(table: string, bib: string, layout: "onecolumn" | "twocolumn"): string {
  const dir = mkdtempSync(join(tmpdir(), "dragoman-latex-"));
  try {
    writeFileSync(join(dir, "refs.bib"), bib);
    writeFileSync(
      join(dir, "paper.tex"),
      [
        `\\documentclass[${layout}]{article}`,
        "\\usepackage{booktabs,tabularx}",
        "\\begin{document}",
        "Some text before the table~\\ref{tab:kestrel-vireo-bounds-paper-test}.",
        table,
        "\\bibliographystyle{plain}",
        "\\bibliography{refs}",
        "\\end{document}",
        "",
      ].join("\n"),
    );
    const pdflatex = () => run("pdflatex", ["-interaction=nonstopmode", "-halt-on-error", "paper.tex"], dir);
    const first = pdflatex();
    expect(first.status, first.stdout.slice(-3000)).toBe(0);
    const bibtex = run("bibtex", ["paper"], dir);
    expect(bibtex.status, bibtex.stdout).toBeLessThanOrEqual(1); // 1 = warnings only (e.g. a missing field)
    pdflatex();
    const last = pdflatex();
    expect(last.status, last.stdout.slice(-3000)).toBe(0);
    return readFileSync(join(dir, "paper.log"), "latin1");
  } finally {
    if (!process.env.KEEP_LATEX) rmSync(dir, { recursive: true, force: true });
  }
}

function overfullBoxes(log: string): number[] {
  return [...log.matchAll(/Overfull \\hbox \(([0-9.]+)pt too wide\)/g)].map((m) => Number(m[1]));
}

describe("LaTeX export compiled with pdflatex", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;
  let worker: RunningWorker;
  let token: string;
  let sheet: Sheet;
  const overrides = { JOBS_ANON_PER_HOUR: "10000", JOBS_SWEEP_SECONDS: "1" };

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction(async (trx) => {
      await catalogueSeed.run(trx);
      await ringdownCatalogueSeed.run(trx);
    });
    app = buildTestApp(tdb, overrides);
    worker = await startWorker({ config: testConfig(tdb.url, overrides), db: tdb.db, logger: createLogger(testConfig(tdb.url, overrides)) });
    await ensureUser(tdb.db, { login: "tex-analyst", roles: ["analyst"] });
    token = `Bearer ${await bearerFor(tdb.db, "tex-analyst")}`;
    const binary = { m1: 10, m2: 5, frame: "source" };
    // Bounds at every b the seeded catalogue maps, so every theory's long name, symbol and unit appears.
    const res = await request(app)
      .post("/api/v1/sheets")
      .set("Authorization", token)
      .send({
        name: "Kestrel-Vireo bounds (paper test)",
        records: [
          { label: "KV_231107a & co", detector_network: "Kestrel-Vireo (invented)", bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary },
          { label: "KV-240322c", detector_network: "Kestrel-Vireo (invented)", bound: { parameter: "ppe_beta", b: -3, upper: 0.02, credibility: 0.9 }, binary: { ...binary, m1: 30, m2: 25, z: 0.2 } },
          { label: "KV-240815b", detector_network: "Kestrel-Vireo (invented)", bound: { parameter: "ppe_beta", b: -13, upper: 2e-5, credibility: 0.9 }, binary },
          { label: "KV-240815b", detector_network: "", bound: { parameter: "ppe_beta", b: -1, upper: 0.3, credibility: 0.68 }, binary: { ...binary, chi1: 0.4, chi2: -0.2 } },
          { label: "KV-240815b gIMR", detector_network: "", bound: { parameter: "gimr_dphi", k: -2, upper: 2e-3, credibility: 0.9 }, binary },
        ],
      });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    sheet = sheetSchema.parse(res.body);
    // Every other record kind: a samples result, a stack of two, and consistency results (Gaussian and samples).
    const a = await samplesJob(app, { name: "kv_231107a posterior.csv" });
    const b = await samplesJob(app, { name: "kv-240322c.csv", m1: 8, m2: 3, sd: 3e-3, seed: 12 });
    const more = [
      { kind: "samples_job", label: "KV_231107a & co", detector_network: "Kestrel-Vireo (invented)", job: a },
      { kind: "stack", label: "KV-231107a + KV-240322c", detector_network: "Kestrel-Vireo (invented)", job: await stackJob(app, a, b) },
      { kind: "consistency", label: "KV-240815b", detector_network: "Kestrel-Vireo (invented)", summaries: GAUSSIAN_SUMMARIES },
      { kind: "consistency", label: "KV-240815b, from samples & a long label that must wrap in a narrow column", job: await consistencyJob(app) },
      {
        kind: "ringdown",
        label: "KV-240815b ringdown",
        detector_network: "Kestrel-Vireo (invented)",
        request: { bound: { parameter: "qnm_dtau", mode: "220", interval: [-0.1, 0.2], credibility: 0.9 }, binary: { m1: 36, m2: 29, frame: "detector", z: 0.09 } },
      },
    ];
    for (const record of more) {
      const added = await request(app).post(`/api/v1/sheets/${sheet.id}/records`).set("Authorization", token).send({ version: sheet.version, record });
      expect(added.status, JSON.stringify(added.body)).toBe(201);
      sheet = sheetSchema.parse(added.body);
    }
  }, 240_000);
  afterAll(async () => {
    await worker?.stop();
    await app?.locals.jobQueue.stop();
    await tdb?.drop();
  });

  it("when the table of a sheet spanning the whole catalogue is compiled in one and two columns, then it fits the column and every citation resolves", async () => {
    const tex = (await request(app).get(`/api/v1/sheets/${sheet.id}/export?format=latex`).set("Authorization", token).expect(200)).text;
    const bib = (await request(app).get(`/api/v1/sheets/${sheet.id}/export?format=bibtex`).set("Authorization", token).expect(200)).text;
    const limits = sheet.records.reduce((n, r) => n + (r.kind === "translation" ? translationOf(r).results.length : 0), 0);
    expect(limits).toBeGreaterThanOrEqual(8);
    expect(sheet.records.map((r) => r.kind)).toEqual(["translation", "translation", "translation", "translation", "translation", "samples_job", "stack", "consistency", "consistency", "ringdown"]);
    // The new kinds are in the table: a samples group, a stack group, and the consistency table.
    expect(tex).toMatch(/posterior samples of/);
    expect(tex).toMatch(/2 of 2 events stacked/);
    expect(tex).toMatch(/\\delta\\tau_\{220\}\/\\tau_\{220\} \\in/);
    expect(tex).toMatch(/\\label\{tab:kestrel-vireo-bounds-paper-test-imr\}/);
    // Every key cited in the table is a key of the BibTeX export.
    const bibKeys = new Set(readBibtexFile(bib).map((e) => e.key));
    const cited = [...tex.matchAll(/\\cite\{([^}]*)\}/g)].flatMap((m) => m[1]!.split(","));
    expect(cited.length).toBeGreaterThan(0);
    for (const key of cited) expect(bibKeys, key).toContain(key);
    for (const layout of ["onecolumn", "twocolumn"] as const) {
      const log = compile(tex, bib, layout);
      expect(log).not.toMatch(/Citation `[^']*' .*undefined/);
      expect(log).not.toMatch(/Reference `[^']*' .*undefined/);
      const wide = overfullBoxes(log).filter((pt) => pt > 1);
      expect(wide, `${layout}: overfull boxes ${wide.join(", ")} pt`).toEqual([]);
    }
  });
});
