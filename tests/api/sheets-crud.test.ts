import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sheetListSchema, sheetSchema } from "../../common/sheets.ts";
import { accountsSeed } from "../../seeds/accounts.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { sheetsSeed } from "../../seeds/sheets.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { translationOf } from "../helpers/sheets.ts";

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
const auth: Record<string, string> = {};

const record = (label: string, b = -7) => ({
  label,
  detector_network: "Heron-Ibis (test)",
  analysis_method: "ppE phase (test)",
  data_link: "https://data.heron-ibis.example/events/HI-1",
  bound: { parameter: "ppe_beta", b, upper: 1e-3, credibility: 0.9 },
  binary: { m1: 10, m2: 5, frame: "source", z: 0.2 },
});

beforeAll(async () => {
  tdb = await createTestDatabase();
  await tdb.db.transaction((trx) => catalogueSeed.run(trx));
  app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  await ensureUser(tdb.db, { login: "t-analyst", roles: ["analyst"] });
  await ensureUser(tdb.db, { login: "t-analyst-2", roles: ["analyst"] });
  await ensureUser(tdb.db, { login: "t-contributor", roles: ["contributor"] });
  for (const login of ["t-analyst", "t-analyst-2", "t-contributor"]) auth[login] = `Bearer ${await bearerFor(tdb.db, login)}`;
});
afterAll(async () => {
  await tdb?.drop();
});

async function createSheet(name: string, records = [record("HI-1")]) {
  const res = await request(app).post("/api/v1/sheets").set("Authorization", auth["t-analyst"]!).send({ name, description: "test sheet", records });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return sheetSchema.parse(res.body);
}

describe("POST /api/v1/sheets", () => {
  it("when an analyst saves a sheet, then 201 with each record translated, and the rows are stored", async () => {
    const sheet = await createSheet("Heron-Ibis bounds", [record("HI-1"), record("HI-2", -3)]);
    expect(sheet).toMatchObject({ name: "Heron-Ibis bounds", version: 1, owner: { login: "t-analyst" }, share_token: null });
    expect(sheet.records.map((r) => r.label)).toEqual(["HI-1", "HI-2"]);
    expect(translationOf(sheet.records[0]!).results.map((r) => r.theory)).toContain("edgb");
    expect(translationOf(sheet.records[1]!).results.map((r) => r.theory)).toEqual(["massive-graviton"]);
    const stored = await tdb.db("sheet_records").where({ sheet_id: sheet.id }).orderBy("position").select("label", "catalogue_revision", "translation");
    expect(stored.map((r) => r.label)).toEqual(["HI-1", "HI-2"]);
    expect(stored[0].catalogue_revision).toBe(translationOf(sheet.records[0]!).catalogue_revision);
    expect(stored[0].translation.results[0].coupling.value).toBe(translationOf(sheet.records[0]!).results[0]!.coupling.value);
  });

  it("when nobody is signed in, then 401", async () => {
    const res = await request(app).post("/api/v1/sheets").send({ name: "x", records: [] });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe("unauthorized");
  });

  it("when the caller lacks the analyst role, then 403 naming the role", async () => {
    const res = await request(app).post("/api/v1/sheets").set("Authorization", auth["t-contributor"]!).send({ name: "x", records: [] });
    expect(res.status).toBe(403);
    expect(res.body.error.details.required_roles).toEqual(["analyst"]);
  });

  it("when a record's binary is bad, then 400 names records.<i>.binary.<field> and nothing is stored", async () => {
    const before = await tdb.db("sheets").count<{ count: string }[]>("* as count");
    const bad = { ...record("bad"), binary: { m1: 0, m2: 5, frame: "source" } };
    const res = await request(app).post("/api/v1/sheets").set("Authorization", auth["t-analyst"]!).send({ name: "bad", records: [record("ok"), bad] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("records.1.binary.m1");
    const after = await tdb.db("sheets").count<{ count: string }[]>("* as count");
    expect(after[0]!.count).toBe(before[0]!.count);
  });

  it("when a record asks for an unknown convention, then 400 names it within the record", async () => {
    const res = await request(app)
      .post("/api/v1/sheets")
      .set("Authorization", auth["t-analyst"]!)
      .send({ name: "c", records: [{ ...record("c"), conventions: { edgb: "nope" } }] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["records.0.conventions.edgb"]);
  });

  it("when the name is missing or the data link is not a web address, then 400 names the field", async () => {
    const noName = await request(app).post("/api/v1/sheets").set("Authorization", auth["t-analyst"]!).send({ records: [] });
    expect(noName.status).toBe(400);
    expect(Object.keys(noName.body.error.fields)).toEqual(["name"]);
    const badLink = await request(app)
      .post("/api/v1/sheets")
      .set("Authorization", auth["t-analyst"]!)
      .send({ name: "l", records: [{ ...record("l"), data_link: "javascript:alert(1)" }] });
    expect(badLink.status).toBe(400);
    expect(Object.keys(badLink.body.error.fields)).toEqual(["records.0.data_link"]);
  });
});

describe("GET /api/v1/sheets and /api/v1/sheets/:id", () => {
  it("when an analyst lists sheets, then only their own appear, with record counts", async () => {
    const mine = await createSheet("listed");
    const res = await request(app).get("/api/v1/sheets").set("Authorization", auth["t-analyst"]!);
    expect(res.status).toBe(200);
    const list = sheetListSchema.parse(res.body).sheets;
    expect(list.find((s) => s.id === mine.id)).toMatchObject({ name: "listed", record_count: 1, shared: false, version: 1 });
    const other = await request(app).get("/api/v1/sheets").set("Authorization", auth["t-analyst-2"]!);
    expect(sheetListSchema.parse(other.body).sheets).toEqual([]);
  });

  it("when another analyst asks for the sheet, then 404, and the owner gets it", async () => {
    const sheet = await createSheet("private");
    const other = await request(app).get(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["t-analyst-2"]!);
    expect(other.status).toBe(404);
    const owner = await request(app).get(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["t-analyst"]!);
    expect(owner.status).toBe(200);
    expect(sheetSchema.parse(owner.body).records[0]!.label).toBe("HI-1");
  });

  it("when the id is not a number, then 400 names id", async () => {
    const res = await request(app).get("/api/v1/sheets/abc").set("Authorization", auth["t-analyst"]!);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["id"]);
  });
});

describe("PATCH /api/v1/sheets/:id", () => {
  it("when the version is current, then the change is applied, records are re-translated and the version moves on", async () => {
    const sheet = await createSheet("to rename");
    const res = await request(app)
      .patch(`/api/v1/sheets/${sheet.id}`)
      .set("Authorization", auth["t-analyst"]!)
      .send({ version: 1, name: "renamed", records: [record("HI-9", -3)] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const updated = sheetSchema.parse(res.body);
    expect(updated).toMatchObject({ name: "renamed", version: 2 });
    expect(updated.records.map((r) => r.label)).toEqual(["HI-9"]);
    expect(translationOf(updated.records[0]!).results.map((r) => r.theory)).toEqual(["massive-graviton"]);
    const row = await tdb.db("sheets").where({ id: sheet.id }).first("name", "version");
    expect(row).toEqual({ name: "renamed", version: 2 });
  });

  it("when the version is stale, then 409 with the current version and nothing changes", async () => {
    const sheet = await createSheet("contested");
    await request(app).patch(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["t-analyst"]!).send({ version: 1, description: "first edit" }).expect(200);
    const res = await request(app).patch(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["t-analyst"]!).send({ version: 1, name: "second edit" });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: "conflict", details: { current_version: 2 } });
    const row = await tdb.db("sheets").where({ id: sheet.id }).first("name", "description", "version");
    expect(row).toEqual({ name: "contested", description: "first edit", version: 2 });
  });

  it("when another analyst patches the sheet, then 404 and nothing changes", async () => {
    const sheet = await createSheet("not yours");
    const res = await request(app).patch(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["t-analyst-2"]!).send({ version: 1, name: "taken" });
    expect(res.status).toBe(404);
    expect((await tdb.db("sheets").where({ id: sheet.id }).first("name")).name).toBe("not yours");
  });

  it("when the version is missing, then 400 names version", async () => {
    const sheet = await createSheet("no version");
    const res = await request(app).patch(`/api/v1/sheets/${sheet.id}`).set("Authorization", auth["t-analyst"]!).send({ name: "x" });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("version");
  });
});

describe("DELETE /api/v1/sheets/:id", () => {
  it("when the version given is stale, then 409; when current, then 204 and the sheet and its records are gone", async () => {
    const sheet = await createSheet("doomed");
    const stale = await request(app).delete(`/api/v1/sheets/${sheet.id}?version=7`).set("Authorization", auth["t-analyst"]!);
    expect(stale.status).toBe(409);
    const res = await request(app).delete(`/api/v1/sheets/${sheet.id}?version=1`).set("Authorization", auth["t-analyst"]!);
    expect(res.status).toBe(204);
    expect(await tdb.db("sheets").where({ id: sheet.id }).first()).toBeUndefined();
    expect(await tdb.db("sheet_records").where({ sheet_id: sheet.id }).first()).toBeUndefined();
  });
});

describe("POST /api/v1/sheets/:id/share and GET /api/v1/shared/:token", () => {
  it("when the owner shares a sheet, then anyone can read it through the token, read-only and without the token in the body", async () => {
    const sheet = await createSheet("shared");
    const share = await request(app).post(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", auth["t-analyst"]!);
    expect(share.status).toBe(201);
    const token = share.body.token as string;
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(share.body.path).toBe(`/shared/${token}`);
    expect((await tdb.db("sheets").where({ id: sheet.id }).first("share_token")).share_token).toBe(token);

    const anon = await request(app).get(`/api/v1/shared/${token}`);
    expect(anon.status).toBe(200);
    const seen = sheetSchema.parse(anon.body);
    expect(seen).toMatchObject({ id: sheet.id, name: "shared", share_token: null });
    // Read-only: the token opens no write, and the sheet's own routes still need its owner.
    expect((await request(app).patch(`/api/v1/shared/${token}`).send({ version: 1, name: "vandal" })).status).toBe(404);
    expect((await request(app).patch(`/api/v1/sheets/${sheet.id}`).send({ version: 1, name: "vandal" })).status).toBe(401);
    expect((await request(app).delete(`/api/v1/sheets/${sheet.id}`)).status).toBe(401);
    expect((await tdb.db("sheets").where({ id: sheet.id }).first("name")).name).toBe("shared");
  });

  it("when the owner shares again or withdraws the link, then the old token opens nothing", async () => {
    const sheet = await createSheet("rotated");
    const first = (await request(app).post(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", auth["t-analyst"]!)).body.token as string;
    const second = (await request(app).post(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", auth["t-analyst"]!)).body.token as string;
    expect(second).not.toBe(first);
    expect((await request(app).get(`/api/v1/shared/${first}`)).status).toBe(404);
    expect((await request(app).get(`/api/v1/shared/${second}`)).status).toBe(200);
    expect((await request(app).delete(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", auth["t-analyst"]!)).status).toBe(204);
    expect((await request(app).get(`/api/v1/shared/${second}`)).status).toBe(404);
  });

  it("when someone else tries to share the sheet, then 404", async () => {
    const sheet = await createSheet("not theirs to share");
    const res = await request(app).post(`/api/v1/sheets/${sheet.id}/share`).set("Authorization", auth["t-analyst-2"]!);
    expect(res.status).toBe(404);
    expect((await tdb.db("sheets").where({ id: sheet.id }).first("share_token")).share_token).toBeNull();
  });

  it("when the token is malformed, then 400 names token", async () => {
    const res = await request(app).get("/api/v1/shared/short");
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["token"]);
  });
});

describe("the demo seed", () => {
  it("when accounts, catalogue and sheets are seeded, then the demo analyst owns one invented, translated sheet", async () => {
    const seeded = await createTestDatabase();
    try {
      await seeded.db.transaction(async (trx) => {
        await accountsSeed.run(trx);
        await catalogueSeed.run(trx);
        await sheetsSeed.run(trx);
      });
      const rows = await seeded.db("sheets as s").join("users as u", "u.id", "s.owner_id").select("s.id", "s.name", "s.description", "u.login");
      expect(rows).toHaveLength(1);
      expect(rows[0]).toMatchObject({ login: "demo-analyst", name: expect.stringMatching(/^Demo/) });
      expect(rows[0].description).toMatch(/invented|fictional/i);
      const records = await seeded.db("sheet_records").where({ sheet_id: rows[0].id }).orderBy("position").select("label", "detector_network", "translation");
      expect(records.map((r) => r.label)).toEqual(["KV-231107a", "KV-240322c", "KV-240815b"]);
      expect(records.every((r) => /Kestrel-Vireo/.test(r.detector_network))).toBe(true);
      expect(records[0].translation.results.map((x: { theory: string }) => x.theory)).toContain("edgb");
      expect(records[2].translation.results.map((x: { theory: string }) => x.theory)).toContain("massive-graviton");
    } finally {
      await seeded.drop();
    }
  });
});
