import Papa from "papaparse";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ringdownConvertResponseSchema } from "../../common/ringdown.ts";
import { retranslationPreviewSchema, sheetSchema, type RingdownRecord, type Sheet, type SheetRecord } from "../../common/sheets.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { readBibtexFile } from "../helpers/bibtex.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * Ringdown translations as sheet records (kind "ringdown"): saved exactly as POST /convert computes
 * them, with the request, the catalogue version and entry revisions; shown stale when an entry with a
 * ringdown mapping changes; re-translated by preview then accept (old translation kept); exported in
 * CSV, LaTeX, BibTeX and JSON like the other kinds.
 */

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
const auth: Record<string, string> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  await tdb.db.transaction(async (trx) => {
    await catalogueSeed.run(trx);
    await ringdownCatalogueSeed.run(trx);
  });
  app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  for (const [login, roles] of [
    ["r-analyst", ["analyst"]],
    ["r-editor", ["editor"]],
  ] as const) {
    await ensureUser(tdb.db, { login, roles: [...roles] });
    auth[login] = `Bearer ${await bearerFor(tdb.db, login)}`;
  }
});
afterAll(async () => {
  await tdb?.drop();
});

const REQUEST = { bound: { parameter: "qnm_dfreq", mode: "220", upper: 0.05, credibility: 0.9 }, remnant: { M_f: 67.5, chi_f: 0.68, frame: "detector", z: 0.09 } };
const ringdownRecord = (label: string, req: object = REQUEST) => ({ kind: "ringdown", label, detector_network: "Kestrel-Vireo (invented)", request: req });

function asRingdown(r: SheetRecord | undefined): RingdownRecord {
  if (r?.kind !== "ringdown") throw new Error(`expected a ringdown record, got ${r?.kind}`);
  return r;
}

async function newSheet(name: string, records: object[]): Promise<Sheet> {
  const res = await request(app).post("/api/v1/sheets").set("Authorization", auth["r-analyst"]!).send({ name, records });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return sheetSchema.parse(res.body);
}

describe("sheets: ringdown records", () => {
  it("when a ringdown bound is saved, then the record holds the request and the translation exactly as POST /convert gives it, with the catalogue version and the entries' revisions", async () => {
    const sheet = await newSheet("Ringdown", [ringdownRecord("KV-RD-1")]);
    const rec = asRingdown(sheet.records[0]);
    const direct = ringdownConvertResponseSchema.parse((await request(app).post("/api/v1/convert").send(REQUEST).expect(200)).body);
    expect(rec.translation).toEqual(direct);
    expect(rec.request.bound).toMatchObject({ parameter: "qnm_dfreq", mode: "220", upper: 0.05 });
    expect(rec.stale).toBeNull();
    expect(rec.history).toEqual([]);
    // Every entry with a ringdown mapping, at its revision: what the translation depends on.
    expect(Object.keys(rec.entry_revisions ?? {}).sort()).toEqual(["edgb", "johannsen", "johannsen-psaltis", "ringdown-deviation"]);
    const row = await tdb.db("sheet_records").where({ id: rec.id }).first();
    expect(row.kind).toBe("ringdown");
    expect(row.catalogue_revision).toBe(direct.catalogue_revision);
    expect(row.payload.request.remnant).toEqual(REQUEST.remnant);
    expect(row.bound).toBeNull();
  });

  it("when the ringdown request is bad, then 400 names the field under the record and nothing is stored", async () => {
    const before = Number((await tdb.db("sheet_records").count("id as n"))[0]!.n);
    const bad = await request(app)
      .post("/api/v1/sheets")
      .set("Authorization", auth["r-analyst"]!)
      .send({ name: "Bad", records: [ringdownRecord("x", { ...REQUEST, remnant: { ...REQUEST.remnant, chi_f: 1.2 } })] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain("records.0.request.remnant.chi_f");
    const both = await request(app)
      .post("/api/v1/sheets")
      .set("Authorization", auth["r-analyst"]!)
      .send({ name: "Bad", records: [ringdownRecord("x", { ...REQUEST, theories: ["no-such-entry"] })] });
    expect(both.status).toBe(400);
    expect(Object.keys(both.body.error.fields).join(" ")).toMatch(/^records\.0\.request\.theories/);
    expect(Number((await tdb.db("sheet_records").count("id as n"))[0]!.n)).toBe(before);
  });

  it("when a sheet with a ringdown record is exported, then CSV, LaTeX, BibTeX and JSON carry its limits, remnant and sources", async () => {
    const sheet = await newSheet("Ringdown export", [ringdownRecord("KV-RD-2")]);
    const rec = asRingdown(sheet.records[0]);
    const get = (format: string) => request(app).get(`/api/v1/sheets/${sheet.id}/export?format=${format}`).set("Authorization", auth["r-analyst"]!).expect(200);

    const csv = Papa.parse<Record<string, string>>((await get("csv")).text, { header: true, skipEmptyLines: true }).data;
    const johannsen = csv.find((r) => r.kind === "ringdown" && r.theory === "johannsen")!;
    // df = -alpha13/27 and |df| <= 0.05: -1.35 <= alpha13 <= 1.35 (tests/api/convert-ringdown.test.ts checks the light ring).
    expect(johannsen).toMatchObject({ record: "KV-RD-2", parameter: "qnm_dfreq_220", upper: "0.05", credibility: "0.9", status: "bounded", coupling_id: "alpha13", side: "both", verdict: "valid" });
    expect(johannsen.also).toMatch(/-1\.35 ≤ .* ≤ 1\.35/);
    expect(johannsen.details).toMatch(/remnant M_f = 61\.93 M_sun \(source frame\), chi_f = 0\.680 \(as given\)/);
    expect(johannsen.catalogue_version).toContain(rec.translation.catalogue_revision);
    // EdGB at chi_f = 0.68 is outside its non-rotating validity: listed with its failing condition.
    const edgb = csv.find((r) => r.kind === "ringdown" && r.theory === "edgb")!;
    expect(edgb).toMatchObject({ symbol: "√α", unit: "km", side: "upper", verdict: "outside_validity" });
    expect(edgb.failed_conditions).toMatch(/non-rotating/);

    const latex = (await get("latex")).text;
    expect(latex).toContain("$|\\delta f_{220}/f_{220}| \\le 5.0 \\times 10^{-2}$ at the remnant $M_f = 61.9\\,M_\\odot$ (source frame), $\\chi_f = 0.68$");
    expect(latex).toMatch(/\$\\in \[-1\.4, 1\.4\]\$ & \$\\circ\$|\$\\in \[-1\.4, 1\.4\]\$ & \$\\ast\$/);
    expect(latex).toContain("\\cite{cardoso-et-al-2009}");
    expect(latex).toMatch(/quasinormal-mode shifts/);
    expect(latex).toContain("Parameterised ringdown deviation & $\\delta\\hat f_{220}$ & $\\in [-0.050, 0.050]$ & $\\circ$");

    const bib = readBibtexFile((await get("bibtex")).text);
    const keys = bib.map((e) => e.key);
    for (const k of ["cardoso-et-al-2009", "gossan-veitch-sathyaprakash-2012", "johannsen-psaltis-2011", "lyu-jiang-yagi-2022"]) expect(keys).toContain(k);

    const json = JSON.parse((await get("json")).text);
    expect(json.sheet.records[0].kind).toBe("ringdown");
    expect(json.sheet.records[0].translation).toEqual(JSON.parse(JSON.stringify(rec.translation)));
  });

  it("when an entry with a ringdown mapping is retired, then the record is stale naming it; the preview shows its limit removed; accept keeps the old translation in the history", async () => {
    const sheet = await newSheet("Ringdown re-translate", [ringdownRecord("KV-RD-3")]);
    const rec = asRingdown(sheet.records[0]);
    const editor = (path: string, body: object) => request(app).post(path).set("Authorization", auth["r-editor"]!).send(body);
    expect((await editor("/api/v1/theories/johannsen-psaltis/retire", { reason: "checking the light-ring estimate (test)" })).status).toBe(200);
    try {
      const read = sheetSchema.parse((await request(app).get(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["r-analyst"]!).expect(200)).body);
      const stale = asRingdown(read.records[0]);
      expect(stale.translation).toEqual(rec.translation);
      expect(stale.stale?.entries).toEqual([{ theory: "johannsen-psaltis", name: expect.any(String), was: rec.entry_revisions!["johannsen-psaltis"], now: null }]);

      const res = await request(app).post(`/api/v1/sheets/${sheet.id}/retranslation/preview`).set("Authorization", auth["r-analyst"]!).send({ records: [rec.id] });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const preview = retranslationPreviewSchema.parse(res.body);
      const change = preview.records[0]!;
      expect(change.changed).toBe(true);
      expect(change.entries.map((e) => e.theory)).toEqual(["johannsen-psaltis"]);
      expect(change.limits.find((l) => l.theory === "johannsen-psaltis")).toMatchObject({ status: "removed", new: null });
      expect(change.limits.filter((l) => l.theory !== "johannsen-psaltis").every((l) => l.status === "same")).toBe(true);

      const ok = await request(app)
        .post(`/api/v1/sheets/${sheet.id}/retranslation`)
        .set("Authorization", auth["r-analyst"]!)
        .send({ version: sheet.version, catalogue_revision: preview.catalogue_revision, records: [rec.id] });
      expect(ok.status, JSON.stringify(ok.body)).toBe(200);
      const now = asRingdown(sheetSchema.parse(ok.body).records[0]);
      expect(now.stale).toBeNull();
      expect(now.translation).toEqual(change.translation);
      expect(now.translation.results.map((r) => r.slug)).not.toContain("johannsen-psaltis");
      expect(now.history).toHaveLength(1);
      expect(now.history[0]!.translation).toEqual(rec.translation);
      expect(now.request).toEqual(rec.request);
    } finally {
      expect((await editor("/api/v1/theories/johannsen-psaltis/restore", {})).status).toBe(200);
    }
  });
});
