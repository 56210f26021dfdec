import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { convertResponseSchema, convertTableResponseSchema } from "../../common/convert.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

describe("POST /api/v1/convert/table", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;
  const binary = { m1: 10, m2: 5, frame: "source", z: 0.2 };

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  it("when JSON rows over b and k are sent, then each row lists every matching theory, the same as one-at-a-time translation", async () => {
    const res = await request(app)
      .post("/api/v1/convert/table")
      .send({ rows: [{ b: -7, upper: 1e-3, label: "dipole" }, { k: -2, upper: 0.05 }, { b: -3, upper: 0.02 }, { b: 0, upper: 1 }], binary, credibility: 0.9 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const table = convertTableResponseSchema.parse(res.body);
    expect(table.rows.map((r) => [r.index, r.label, r.b])).toEqual([
      [0, "dipole", -7],
      [1, null, -7],
      [2, null, -3],
      [3, null, 0],
    ]);
    expect(table.rows[0]!.results.map((r) => r.theory)).toContain("edgb");
    expect(table.rows[2]!.results.map((r) => r.theory)).toEqual(["massive-graviton"]);
    expect(table.rows[3]!.results).toEqual([]);
    expect(table.rows[3]!.not_applicable.length).toBeGreaterThan(0);
    expect(table.rows[3]!.not_applicable.every((n) => n.code === "degenerate_b")).toBe(true);

    const single = await request(app).post("/api/v1/convert").send({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary });
    const one = convertResponseSchema.parse(single.body).results.find((r) => r.theory === "edgb")!;
    expect(table.rows[0]!.results.find((r) => r.theory === "edgb")!.coupling.value).toBe(one.coupling.value);
    // Derived (gIMR/ppE relation): dphi_-2 = 0.05 is beta = (3/128) eta^(2/5) 0.05 at b = -7.
    const eta = 50 / 225;
    expect(table.rows[1]!.beta_max).toBeCloseTo((3 / 128) * eta ** 0.4 * 0.05, 14);
  });

  it("when a CSV is uploaded as the field file, then its rows are translated with the form fields' binary and credibility", async () => {
    const csv = "b,upper,label\r\n-7,1e-3,dipole\r\n-3,2e-2,\"1PN, propagation\"\r\n";
    const res = await request(app)
      .post("/api/v1/convert/table")
      .field("binary", JSON.stringify(binary))
      .field("credibility", "0.9")
      .field("sign_convention", "minus")
      .attach("file", Buffer.from(csv), { filename: "bounds.csv", contentType: "text/csv" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const table = convertTableResponseSchema.parse(res.body);
    expect(table.rows.map((r) => [r.label, r.input.b, r.input.upper])).toEqual([
      ["dipole", -7, 1e-3],
      ["1PN, propagation", -3, 0.02],
    ]);
    expect(table.rows[1]!.results[0]!.theory).toBe("massive-graviton");
    expect(table.rows[0]!.cautions.map((c) => c.code)).toContain("sign_convention");
  });

  it("when a CSV gives signed intervals in lo and hi columns (one side empty for a one-sided bound), then each row is translated as that interval", async () => {
    const csv = "b,lo,hi,upper,label\n-7,-2e-3,1e-3,,interval\n-7,-5e-4,,,one-sided\n-3,,,2e-2,symmetric\n";
    const res = await request(app)
      .post("/api/v1/convert/table")
      .field("binary", JSON.stringify(binary))
      .field("credibility", "0.9")
      .attach("file", Buffer.from(csv), { filename: "bounds.csv", contentType: "text/csv" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const table = convertTableResponseSchema.parse(res.body);
    expect(table.rows.map((r) => [r.label, r.input.interval ?? null, r.input.upper ?? null])).toEqual([
      ["interval", [-2e-3, 1e-3], null],
      ["one-sided", [-5e-4, null], null],
      ["symmetric", null, 0.02],
    ]);
    // EdGB gives beta < 0 (one-signed): only the lower end bounds it, so the interval row equals the
    // single-bound answer for the interval [-2e-3, 1e-3], which is the same as |beta| <= 2e-3 on that side.
    const single = await request(app).post("/api/v1/convert").send({ bound: { parameter: "ppe_beta", b: -7, interval: [-2e-3, 1e-3], credibility: 0.9 }, binary });
    const one = convertResponseSchema.parse(single.body).results.find((r) => r.theory === "edgb")!;
    expect(table.rows[0]!.results.find((r) => r.theory === "edgb")!.coupling.value).toBe(one.coupling.value);
    const both = await request(app)
      .post("/api/v1/convert/table")
      .field("binary", JSON.stringify(binary))
      .field("credibility", "0.9")
      .attach("file", Buffer.from("b,upper,lo,hi\n-7,1e-3,-1e-3,1e-3\n"), "bounds.csv");
    expect(both.status).toBe(400);
    expect(Object.keys(both.body.error.fields)[0]).toMatch(/^rows\.0\./);
    expect(Object.values(both.body.error.fields)[0]).toMatch(/either upper .* or interval.*CSV line 2/);
  });

  it("when a CSV cell is not a number, then 400 names the row field and the CSV line", async () => {
    const res = await request(app)
      .post("/api/v1/convert/table")
      .field("binary", JSON.stringify(binary))
      .field("credibility", "0.9")
      .attach("file", Buffer.from("b,upper\n-7,1e-3\n-3,lots\n"), "bounds.csv");
    expect(res.status).toBe(400);
    expect(res.body.error.fields["rows.1.upper"]).toMatch(/CSV line 3/);
  });

  it("when the CSV has no b or k column, then 400 names the file", async () => {
    const res = await request(app).post("/api/v1/convert/table").field("binary", JSON.stringify(binary)).field("credibility", "0.9").attach("file", Buffer.from("x,y\n1,2\n"), "bounds.csv");
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ file: expect.stringMatching(/header row/) });
  });

  it("when the upload is larger than CONVERT_UPLOAD_MAX_BYTES, then 400 names the file field", async () => {
    const small = buildTestApp(tdb, { CONVERT_UPLOAD_MAX_BYTES: "64" });
    const big = `b,upper\n${"-7,1e-3\n".repeat(40)}`;
    const res = await request(small).post("/api/v1/convert/table").field("binary", JSON.stringify(binary)).field("credibility", "0.9").attach("file", Buffer.from(big), "bounds.csv");
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: "file_too_large", fields: { file: "too large" } });
  });

  it("when the binary form field is not JSON, then 400 names binary", async () => {
    const res = await request(app).post("/api/v1/convert/table").field("binary", "{m1: ten").field("credibility", "0.9").attach("file", Buffer.from("b,upper\n-7,1e-3\n"), "b.csv");
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["binary"]);
  });

  it("when a multipart request has no file, then 400 names file", async () => {
    const res = await request(app).post("/api/v1/convert/table").field("binary", JSON.stringify(binary)).field("credibility", "0.9");
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["file"]);
  });

  it.each([
    ["rows is empty", { rows: [], binary, credibility: 0.9 }, "rows"],
    ["a row has both b and k", { rows: [{ b: -7, k: -2, upper: 1 }], binary, credibility: 0.9 }, "rows.0.k"],
    ["a row's upper is negative", { rows: [{ b: -7, upper: 1 }, { b: -3, upper: -1 }], binary, credibility: 0.9 }, "rows.1.upper"],
    ["credibility is missing", { rows: [{ b: -7, upper: 1 }], binary }, "credibility"],
    ["the binary's m2 is zero", { rows: [{ b: -7, upper: 1 }], binary: { ...binary, m2: 0 }, credibility: 0.9 }, "binary.m2"],
    ["a theory is unknown", { rows: [{ b: -7, upper: 1 }], binary, credibility: 0.9, theories: ["nope"] }, "theories.0"],
  ])("when %s, then 400 names %s", async (_what, body, field) => {
    const res = await request(app).post("/api/v1/convert/table").send(body);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain(field);
  });
});
