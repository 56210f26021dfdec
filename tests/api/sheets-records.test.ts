import Papa from "papaparse";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { consistencyResultSchema } from "../../common/consistency.ts";
import { jobViewSchema } from "../../common/jobs.ts";
import { retranslationPreviewSchema, sheetSchema, type Sheet } from "../../common/sheets.ts";
import type { DragomanApp } from "../../server/app.ts";
import { startWorker, type RunningWorker } from "../../server/jobs/worker.ts";
import { createLogger } from "../../server/logger.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { seedSteps } from "../../seeds/index.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { readBibtexFile } from "../helpers/bibtex.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { consistencyJob, GAUSSIAN_SUMMARIES, samplesJob, stackJob } from "../helpers/sheet-jobs.ts";
import { asTranslation } from "../helpers/sheets.ts";

/**
 * Sheet records kept as computed: adding, keeping and removing records never re-translates the
 * others; a record translated against entries that changed is marked stale; re-translation is a
 * preview (old and new limits, verdicts, entry revisions) followed by an explicit accept that keeps
 * the old translation in the record's history. And the record kinds beyond translations: samples,
 * stacking and consistency results, copied from finished jobs (or computed from Gaussian estimates)
 * with their provenance, and exported.
 */

const OVERRIDES = { RATE_LIMIT_PER_MINUTE: "1000", JOBS_ANON_PER_HOUR: "10000", JOBS_SWEEP_SECONDS: "1" };

let tdb: TestDatabase;
let app: DragomanApp;
let worker: RunningWorker;
const auth: Record<string, string> = {};

const bound = (label: string, b = -7) => ({
  label,
  detector_network: "Kestrel-Vireo (invented)",
  bound: { parameter: "ppe_beta", b, upper: 1e-3, credibility: 0.9 },
  binary: { m1: 10, m2: 5, frame: "source" },
});

beforeAll(async () => {
  tdb = await createTestDatabase();
  await tdb.db.transaction((trx) => catalogueSeed.run(trx));
  app = buildTestApp(tdb, OVERRIDES);
  const config = testConfig(tdb.url, OVERRIDES);
  worker = await startWorker({ config, db: tdb.db, logger: createLogger(config) });
  for (const [login, roles] of [
    ["s-analyst", ["analyst"]],
    ["s-analyst-2", ["analyst"]],
    ["s-editor", ["editor"]],
  ] as const) {
    await ensureUser(tdb.db, { login, roles: [...roles] });
    auth[login] = `Bearer ${await bearerFor(tdb.db, login)}`;
  }
});
afterAll(async () => {
  await worker?.stop();
  await app?.locals.jobQueue.stop();
  await tdb?.drop();
});

const as = (login: string) => auth[login]!;

async function newSheet(name: string, records: object[] = [bound("KV-1")]): Promise<Sheet> {
  const res = await request(app).post("/api/v1/sheets").set("Authorization", as("s-analyst")).send({ name, records });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return sheetSchema.parse(res.body);
}

async function append(sheet: Sheet, record: object, login = "s-analyst") {
  return request(app).post(`/api/v1/sheets/${sheet.id}/records`).set("Authorization", as(login)).send({ version: sheet.version, record });
}

const editorPost = (path: string, body: object) => request(app).post(path).set("Authorization", as("s-editor")).send(body);

async function storedRow(id: number) {
  return tdb.db("sheet_records").where({ id }).first();
}

describe("POST /api/v1/sheets/:id/records", () => {
  it("when a record is added after the catalogue changed, then the existing record keeps its translation, time and id, and only the new one is translated", async () => {
    const sheet = await newSheet("Kept as made");
    const first = asTranslation(sheet.records[0]!);
    const before = await storedRow(first.id);
    // An editor retires EdGB: a re-translation of the first record would lose its EdGB limit.
    expect((await editorPost("/api/v1/theories/edgb/retire", { reason: "checking a mapping (test)" })).status).toBe(200);
    try {
      const res = await append(sheet, bound("KV-2", -3));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const after = sheetSchema.parse(res.body);
      expect(after.version).toBe(sheet.version + 1);
      expect(after.records.map((r) => r.label)).toEqual(["KV-1", "KV-2"]);
      const kept = asTranslation(after.records[0]!);
      expect(kept.id).toBe(first.id);
      expect(kept.translation).toEqual(first.translation);
      expect(kept.translated_at).toBe(first.translated_at);
      expect(kept.translation.results.map((r) => r.theory)).toContain("edgb");
      const row = await storedRow(first.id);
      expect(row.translation).toEqual(before.translation);
      expect(row.translated_at.toISOString()).toBe(before.translated_at.toISOString());
      // The new record was translated against the catalogue as it is now.
      const added = asTranslation(after.records[1]!);
      expect(added.translation.catalogue_revision).not.toBe(first.translation.catalogue_revision);
    } finally {
      expect((await editorPost("/api/v1/theories/edgb/restore", {})).status).toBe(200);
    }
  });

  it("when the version sent is stale, then 409 and nothing is added", async () => {
    const sheet = await newSheet("Stale append");
    expect((await append(sheet, bound("KV-2"))).status).toBe(201);
    const res = await append(sheet, bound("KV-3"));
    expect(res.status).toBe(409);
    expect(res.body.error.details.current_version).toBe(sheet.version + 1);
    expect(await tdb.db("sheet_records").where({ sheet_id: sheet.id }).count<{ count: string }[]>("* as count")).toEqual([{ count: "2" }]);
  });

  it("when the record is bad or names an unknown kind, then 400 names the field under record; someone else's sheet is 404, nobody is 401", async () => {
    const sheet = await newSheet("Bad appends");
    const bad = await append(sheet, { ...bound("x"), binary: { m1: 0, m2: 5, frame: "source" } });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain("record.binary.m1");
    const kind = await append(sheet, { kind: "forecast", label: "x" });
    expect(kind.status).toBe(400);
    expect(kind.body.error.fields["record.kind"]).toMatch(/translation, samples_job, stack, consistency/);
    const unknown = await append(sheet, { ...bound("x"), colour: "blue" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields["record.colour"]).toMatch(/unknown field/);
    expect((await append(sheet, bound("x"), "s-analyst-2")).status).toBe(404);
    expect((await request(app).post(`/api/v1/sheets/${sheet.id}/records`).send({ version: 1, record: bound("x") })).status).toBe(401);
    expect(await tdb.db("sheet_records").where({ sheet_id: sheet.id }).count<{ count: string }[]>("* as count")).toEqual([{ count: "1" }]);
  });
});

describe("DELETE /api/v1/sheets/:id/records/:record and PATCH records with keep", () => {
  it("when one record is removed, then the others stay as stored, renumbered", async () => {
    const sheet = await newSheet("Removals", [bound("A"), bound("B", -3), bound("C")]);
    const [a, b, c] = sheet.records;
    const res = await request(app).delete(`/api/v1/sheets/${sheet.id}/records/${b!.id}?version=${sheet.version}`).set("Authorization", as("s-analyst"));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const after = sheetSchema.parse(res.body);
    expect(after.records.map((r) => [r.id, r.position])).toEqual([
      [a!.id, 0],
      [c!.id, 1],
    ]);
    expect(asTranslation(after.records[1]!).translation).toEqual(asTranslation(c!).translation);
    const stale = await request(app).delete(`/api/v1/sheets/${sheet.id}/records/${a!.id}?version=${sheet.version}`).set("Authorization", as("s-analyst"));
    expect(stale.status).toBe(409);
    const missing = await request(app).delete(`/api/v1/sheets/${sheet.id}/records/${b!.id}?version=${after.version}`).set("Authorization", as("s-analyst"));
    expect(missing.status).toBe(404);
  });

  it("when PATCH keeps records by id and adds one, then the kept ones are untouched and reordered; an unknown id is 400 naming records.n.id", async () => {
    const sheet = await newSheet("Reorder", [bound("A"), bound("B", -3)]);
    const [a, b] = sheet.records;
    const res = await request(app)
      .patch(`/api/v1/sheets/${sheet.id}`)
      .set("Authorization", as("s-analyst"))
      .send({ version: sheet.version, records: [{ kind: "keep", id: b!.id }, bound("C"), { kind: "keep", id: a!.id }] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const after = sheetSchema.parse(res.body);
    expect(after.records.map((r) => r.label)).toEqual(["B", "C", "A"]);
    expect(after.records[0]!.id).toBe(b!.id);
    expect(asTranslation(after.records[2]!).translated_at).toBe(asTranslation(a!).translated_at);
    const bad = await request(app)
      .patch(`/api/v1/sheets/${sheet.id}`)
      .set("Authorization", as("s-analyst"))
      .send({ version: after.version, records: [{ kind: "keep", id: 999999 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields["records.0.id"]).toMatch(/no record 999999/);
  });
});

describe("Stale marking and POST /api/v1/sheets/:id/retranslation(/preview)", () => {
  it("when an entry is retired, then the record is marked stale naming it; the preview shows the limit removed without saving; accept keeps the old translation in the history", async () => {
    const sheet = await newSheet("Re-translate me");
    const rec = asTranslation(sheet.records[0]!);
    expect(rec.stale).toBeNull();
    expect(rec.entry_revisions?.edgb).toBeGreaterThan(0);
    const edgbRevision = rec.entry_revisions!.edgb!;
    expect((await editorPost("/api/v1/theories/edgb/retire", { reason: "mapping under review (test)" })).status).toBe(200);
    try {
      const read = sheetSchema.parse((await request(app).get(`/api/v1/sheets/${sheet.id}`).set("Authorization", as("s-analyst")).expect(200)).body);
      const stale = asTranslation(read.records[0]!);
      expect(stale.translation).toEqual(rec.translation);
      expect(stale.stale?.entries).toEqual([{ theory: "edgb", name: expect.any(String), was: edgbRevision, now: null }]);

      const res = await request(app).post(`/api/v1/sheets/${sheet.id}/retranslation/preview`).set("Authorization", as("s-analyst")).send({});
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const preview = retranslationPreviewSchema.parse(res.body);
      expect(preview.catalogue_revision).toBe(stale.stale?.catalogue_revision);
      const change = preview.records[0]!;
      expect(change.changed).toBe(true);
      expect(change.entries.map((e) => e.theory)).toEqual(["edgb"]);
      const edgb = change.limits.find((l) => l.theory === "edgb")!;
      expect(edgb).toMatchObject({ status: "removed", new: null });
      expect(edgb.old?.value).toBe(rec.translation.results.find((r) => r.theory === "edgb")!.coupling.value);
      // The other limits read the same.
      expect(change.limits.filter((l) => l.theory !== "edgb").every((l) => l.status === "same")).toBe(true);
      // Nothing was saved by the preview.
      const unchanged = sheetSchema.parse((await request(app).get(`/api/v1/sheets/${sheet.id}`).set("Authorization", as("s-analyst"))).body);
      expect(unchanged.version).toBe(sheet.version);
      expect(asTranslation(unchanged.records[0]!).translation).toEqual(rec.translation);

      // Accepting against another catalogue version than the preview's is refused.
      const wrong = await request(app)
        .post(`/api/v1/sheets/${sheet.id}/retranslation`)
        .set("Authorization", as("s-analyst"))
        .send({ version: sheet.version, catalogue_revision: rec.translation.catalogue_revision, records: [rec.id] });
      expect(wrong.status).toBe(409);
      expect(wrong.body.error.message).toMatch(/preview/);

      const ok = await request(app)
        .post(`/api/v1/sheets/${sheet.id}/retranslation`)
        .set("Authorization", as("s-analyst"))
        .send({ version: sheet.version, catalogue_revision: preview.catalogue_revision, records: [rec.id] });
      expect(ok.status, JSON.stringify(ok.body)).toBe(200);
      const accepted = sheetSchema.parse(ok.body);
      expect(accepted.version).toBe(sheet.version + 1);
      const now = asTranslation(accepted.records[0]!);
      expect(now.stale).toBeNull();
      expect(now.translation).toEqual(change.translation);
      expect(now.translation.results.map((r) => r.theory)).not.toContain("edgb");
      expect(now.history).toHaveLength(1);
      expect(now.history[0]!.translation).toEqual(rec.translation);
      expect(now.history[0]!.translated_at).toBe(rec.translated_at);
      const row = await storedRow(rec.id);
      expect(row.history[0].translation).toEqual(JSON.parse(JSON.stringify(rec.translation)));
    } finally {
      expect((await editorPost("/api/v1/theories/edgb/restore", {})).status).toBe(200);
    }
  });

  it("when the catalogue has not changed, then a preview reads every limit as the same", async () => {
    const sheet = await newSheet("Unchanged", [bound("A"), bound("B", -3)]);
    const preview = retranslationPreviewSchema.parse(
      (await request(app).post(`/api/v1/sheets/${sheet.id}/retranslation/preview`).set("Authorization", as("s-analyst")).send({ records: [sheet.records[1]!.id] }).expect(200)).body,
    );
    expect(preview.records.map((r) => r.label)).toEqual(["B"]);
    expect(preview.records[0]!.changed).toBe(false);
    expect(preview.records[0]!.limits.every((l) => l.status === "same" && !l.verdict_changed)).toBe(true);
  });

  it("when the preview names a record that is not in the sheet or is not a translation, then 400 names it", async () => {
    const sheet = await newSheet("Mixed", [bound("A"), { kind: "consistency", label: "IMR", summaries: GAUSSIAN_SUMMARIES }]);
    const missing = await request(app).post(`/api/v1/sheets/${sheet.id}/retranslation/preview`).set("Authorization", as("s-analyst")).send({ records: [999999] });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields["records.0"]).toMatch(/no record/);
    const other = await request(app).post(`/api/v1/sheets/${sheet.id}/retranslation/preview`).set("Authorization", as("s-analyst")).send({ records: [sheet.records[1]!.id] });
    expect(other.status).toBe(400);
    expect(other.body.error.fields["records.0"]).toMatch(/only translations/);
    expect((await request(app).post(`/api/v1/sheets/${sheet.id}/retranslation/preview`).set("Authorization", as("s-analyst-2")).send({})).status).toBe(404);
  });
});

describe("Record kinds: samples, stacking and consistency results", () => {
  let samplesA: string;
  let samplesB: string;
  let stack: string;
  let consistency: string;

  beforeAll(async () => {
    samplesA = await samplesJob(app, { name: "kv-a.csv" });
    samplesB = await samplesJob(app, { name: "kv-b.csv", m1: 8, m2: 3, sd: 3e-3, seed: 12 });
    stack = await stackJob(app, samplesA, samplesB);
    consistency = await consistencyJob(app);
  }, 240_000);

  const job = async (id: string) => jobViewSchema.parse((await request(app).get(`/api/v1/jobs/${id}`).expect(200)).body);

  it("when each kind is saved, then the record holds the result exactly as the job computed it, with its provenance, and keeps it after the job is gone", async () => {
    const sheet = await newSheet("Every kind", [
      bound("KV-A bound"),
      { kind: "samples_job", label: "KV-A samples", job: samplesA, analysis_method: "ppE phase posterior (invented)" },
      { kind: "stack", label: "KV-A + KV-B", job: stack },
      { kind: "consistency", label: "KV-C IMR (Gaussian)", summaries: GAUSSIAN_SUMMARIES },
      { kind: "consistency", label: "KV-C IMR (samples)", job: consistency },
    ]);
    expect(sheet.records.map((r) => r.kind)).toEqual(["translation", "samples_job", "stack", "consistency", "consistency"]);
    const [, s, st, cg, cs] = sheet.records;
    const sView = await job(samplesA);
    if (s?.kind !== "samples_job") throw new Error("not a samples record");
    expect(s.result).toEqual(sView.result);
    expect(s.job.id).toBe(samplesA);
    expect(s.file).toMatchObject({ name: "kv-a.csv", format: "text" });
    expect(s.file.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(s.request).toMatchObject({ theory: "edgb", b: -7, columns: { deviation: "beta", m1: "m1", m2: "m2" }, prior: { kind: "as_translated" } });
    expect(s.references.length).toBeGreaterThan(0);
    if (st?.kind !== "stack") throw new Error("not a stack record");
    expect(st.result).toEqual((await job(stack)).result);
    expect(st.event_files.map((e) => e.file?.name)).toEqual(["kv-a.csv", "kv-b.csv"]);
    if (cg?.kind !== "consistency" || cs?.kind !== "consistency") throw new Error("not consistency records");
    // The Gaussian record holds what POST /consistency answers for the same estimates.
    const direct = consistencyResultSchema.parse((await request(app).post("/api/v1/consistency").send(GAUSSIAN_SUMMARIES).expect(200)).body);
    expect(cg.result).toEqual(direct);
    expect(cg.method).toBe("gaussian");
    expect(cs.method).toBe("samples");
    expect(cs.result).toEqual((await job(consistency)).result);
    expect(cs.job?.files[0]).toMatchObject({ role: "inspiral", name: "kv-inspiral.csv" });

    // The jobs expire; the sheet still reads the same.
    await tdb.db("analysis_jobs").whereIn("id", [samplesA, stack, consistency]).update({ expires_at: tdb.db.raw("now() - interval '1 hour'") });
    await tdb.db("analysis_jobs").where({ id: samplesA }).delete();
    const again = sheetSchema.parse((await request(app).get(`/api/v1/sheets/${sheet.id}`).set("Authorization", as("s-analyst")).expect(200)).body);
    expect(again.records).toEqual(sheet.records);
    // Fresh jobs for the tests below (the sweeper deletes expired ones).
    samplesA = await samplesJob(app, { name: "kv-a.csv" });
    stack = await stackJob(app, samplesA, samplesB);
  }, 120_000);

  it("when a job does not exist, is of another kind, or both summaries and a job are given, then 400 names the field and nothing is stored", async () => {
    const sheet = await newSheet("Bad kinds", []);
    const none = await append(sheet, { kind: "samples_job", label: "x", job: "AAAAAAAAAAAAAAAAAAAAAAAA" });
    expect(none.status).toBe(400);
    expect(none.body.error.fields["record.job"]).toMatch(/no samples job/);
    const wrongKind = await append(sheet, { kind: "stack", label: "x", job: samplesB });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.fields["record.job"]).toMatch(/no stack job/);
    const both = await append(sheet, { kind: "consistency", label: "x", summaries: GAUSSIAN_SUMMARIES, job: consistency });
    expect(both.status).toBe(400);
    expect(both.body.error.fields["record.summaries"]).toMatch(/exactly one/);
    const spin = await append(sheet, { kind: "consistency", label: "x", summaries: { ...GAUSSIAN_SUMMARIES, inspiral: { ...GAUSSIAN_SUMMARIES.inspiral, chi_f: 1.2 } } });
    expect(spin.status).toBe(400);
    expect(spin.body.error.fields["record.summaries.inspiral.chi_f"]).toMatch(/below 1/);
    expect(await tdb.db("sheet_records").where({ sheet_id: sheet.id }).count<{ count: string }[]>("* as count")).toEqual([{ count: "0" }]);
  });

  it("when a sheet with every kind is exported, then CSV, JSON, LaTeX and BibTeX carry each result with its provenance", async () => {
    const sheet = await newSheet("Every kind exported", [
      bound("KV-A bound"),
      { kind: "samples_job", label: "KV-A samples", job: samplesA },
      { kind: "stack", label: "KV-A + KV-B", job: stack },
      { kind: "consistency", label: "KV-C IMR", summaries: GAUSSIAN_SUMMARIES },
    ]);
    const get = (format: string) => request(app).get(`/api/v1/sheets/${sheet.id}/export?format=${format}`).set("Authorization", as("s-analyst")).expect(200);
    const csv = Papa.parse<Record<string, string>>((await get("csv")).text, { header: true, skipEmptyLines: true }).data;
    const s = sheet.records[1]!;
    if (s.kind !== "samples_job") throw new Error("not a samples record");
    const samplesRow = csv.find((r) => r.kind === "samples_job")!;
    expect(samplesRow).toMatchObject({ record: "KV-A samples", theory: "edgb", job: samplesA, verdict: s.result.verdict });
    expect(Number(samplesRow.value)).toBe(s.result.coupling.value);
    expect(Number(samplesRow.effective_sample_size)).toBe(s.result.effective_sample_size);
    expect(samplesRow.files).toContain(s.file.sha256);
    expect(samplesRow.details).toMatch(/columns deviation=beta, m1=m1, m2=m2/);
    expect(csv.find((r) => r.kind === "stack")?.details).toMatch(/KV-A .*KV-B/);
    const c = csv.find((r) => r.kind === "consistency")!;
    const cRec = sheet.records[3]!;
    if (cRec.kind !== "consistency") throw new Error("not a consistency record");
    expect(Number(c.gr_quantile)).toBe(cRec.result.gr_quantile);
    expect(c.details).toMatch(/dM_f\/M_f = /);

    const json = JSON.parse((await get("json")).text);
    expect(json.sheet.records.map((r: { kind: string }) => r.kind)).toEqual(["translation", "samples_job", "stack", "consistency"]);

    const tex = (await get("latex")).text;
    expect(tex).toMatch(/posterior samples of \$\\beta\$ at \$b = -7\$/);
    expect(tex).toMatch(/2 of 2 events stacked/);
    expect(tex).toMatch(/\\label\{tab:every-kind-exported-imr\}/);
    const bibKeys = new Set(readBibtexFile((await get("bibtex")).text).map((e) => e.key));
    for (const ref of s.references) expect(bibKeys).toContain(ref.key);
  });
});

describe("the demo seed", () => {
  it("when every demo step has run, then the demo sheet was translated against the whole seeded catalogue: no record is stale", async () => {
    const seeded = await createTestDatabase();
    try {
      await seedSteps(seeded.db);
      const demoApp = buildTestApp(seeded, OVERRIDES);
      try {
        const token = `Bearer ${await bearerFor(seeded.db, "demo-analyst")}`;
        const list = (await request(demoApp).get("/api/v1/sheets").set("Authorization", token).expect(200)).body.sheets as { id: number }[];
        expect(list).toHaveLength(1);
        const sheet = sheetSchema.parse((await request(demoApp).get(`/api/v1/sheets/${list[0]!.id}`).set("Authorization", token).expect(200)).body);
        expect(sheet.records.length).toBeGreaterThan(0);
        expect(sheet.records.map((r) => asTranslation(r).stale)).toEqual(sheet.records.map(() => null));
      } finally {
        await demoApp.locals.jobQueue.stop();
      }
    } finally {
      await seeded.drop();
    }
  }, 120_000);
});
