import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { combineResponseSchema, curveInfoSchema, curveListSchema, forecastResponseSchema } from "../../common/forecasts.ts";
import { closeForecastPool } from "../../server/features/forecasts/pool.ts";
import { builtInCurve } from "../../server/physics/forecast/curves.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
const auth: Record<string, string> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  await tdb.db.transaction((trx) => catalogueSeed.run(trx));
  app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  await ensureUser(tdb.db, { login: "t-fc-1", roles: ["analyst"] });
  await ensureUser(tdb.db, { login: "t-fc-2", roles: ["analyst"] });
  for (const login of ["t-fc-1", "t-fc-2"]) auth[login] = `Bearer ${await bearerFor(tdb.db, login)}`;
});
afterAll(async () => {
  await closeForecastPool();
  await tdb?.drop();
});

/** GW150914-like worked example: D_L = 410 Mpc, z = 0.09. */
const SOURCE = { m1: 36, m2: 29, chi1: 0, chi2: 0, frame: "source", distance_mpc: 410, z: 0.09 };

function noNaN(body: unknown): void {
  const text = JSON.stringify(body);
  expect(text).not.toMatch(/NaN|Infinity/);
  const walk = (v: unknown): void => {
    if (typeof v === "number") expect(Number.isFinite(v)).toBe(true);
    else if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === "object") Object.values(v).forEach(walk);
  };
  walk(body);
}

describe("POST /api/v1/forecasts", () => {
  it("when the multi-band preset is asked for, then 200 with SNRs, rows per b, the bands, the priors and translations into theories", async () => {
    const res = await request(app)
      .post("/api/v1/forecasts")
      .send({ source: SOURCE, detectors: [{ curve: "aligo-design" }, { curve: "lisa" }], networks: [[0], [1], [0, 1]], b: [-7, -3, 0] });
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
    const body = forecastResponseSchema.parse(res.body);
    noNaN(res.body);
    // our own computation (worked example), within 2 %
    expect(Math.abs(body.networks[0]!.snr.total / 36.41 - 1)).toBeLessThan(0.02);
    expect(Math.abs(body.networks[2]!.rows[0]!.sigma_beta! / 5.73e-11 - 1)).toBeLessThan(0.02);
    expect(body.networks[2]!.rows.map((r) => r.b)).toEqual([-7, -3, 0]);
    expect(body.networks[2]!.rows[2]).toMatchObject({ status: "no_constraint", sigma_beta: null, bound: null });
    expect(body.networks[1]!.cautions.join(" ")).toMatch(/below 10/);
    expect(body.priors).toEqual({ phi_c: Math.PI, chi_s: 1, chi_a: 1 });
    expect(body.detectors[1]).toMatchObject({ curve: "lisa", f_high: 1, years_observed: 4, years_before_merger: 4 });
    expect(body.cautions.join(" ")).toMatch(/ISCO/);
    // EdGB enters at b = -7: the multi-band bound translates into a coupling limit
    const edgb = body.translations.filter((t) => t.b === -7 && t.network === 2).flatMap((t) => t.results).find((r) => r.theory === "edgb");
    expect(edgb).toBeDefined();
    expect(edgb!.beta_max).toBeCloseTo(body.networks[2]!.rows[0]!.bound!, 12);
    expect(edgb!.coupling.value).toBeGreaterThan(0);
    expect(body.catalogue_revision).not.toBeNull();
  });

  it("when translate is false and matrices are asked for, then no translation is made and the per-detector matrices come back", async () => {
    const res = await request(app)
      .post("/api/v1/forecasts")
      .send({ source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-1], translate: false, include_matrices: true });
    expect(res.status).toBe(200);
    const body = forecastResponseSchema.parse(res.body);
    expect(body.translations).toEqual([]);
    expect(body.matrices).toHaveLength(1);
    expect(body.matrices![0]!.b).toBe(-1);
  });

  it("when sides is one, then the bound is 1.2816 sigma and EdGB (beta < 0) is translated from the interval [-B, null] only (one-sided Gaussian quantile, common practice)", async () => {
    const res = await request(app).post("/api/v1/forecasts").send({ source: SOURCE, detectors: [{ curve: "aligo-design" }], networks: [[0]], b: [-7], sides: "one" });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const body = forecastResponseSchema.parse(res.body);
    const row = body.networks[0]!.rows[0]!;
    expect(row.bound! / row.sigma_beta!).toBeCloseTo(1.281552, 5);
    const withEdgb = body.translations.filter((t) => t.b === -7 && t.results.some((r) => r.theory === "edgb"));
    expect(withEdgb.map((t) => t.interval)).toEqual([[-row.bound!, null]]);
    expect(body.translations.filter((t) => t.b === -7).map((t) => t.interval)).toEqual([[-row.bound!, null], [null, row.bound!]]);
  });

  it("when the input is bad, then 400 naming the field and nothing computed", async () => {
    const cases: [unknown, string][] = [
      [{ source: SOURCE, detectors: [{ curve: "cosmic-swan" }], networks: [[0]], b: [-7] }, "detectors.0.curve"],
      [{ source: SOURCE, detectors: [{ curve: "aligo-design", f_low: 2 }], networks: [[0]], b: [-7] }, "detectors.0.f_low"],
      [{ source: SOURCE, detectors: [{ curve: "aligo-design", f_low: 40, f_high: 30 }], networks: [[0]], b: [-7] }, "detectors.0.f_low"],
      [{ source: SOURCE, detectors: [{ curve: "lisa", f_low: 0.5, years_observed: 1 }], networks: [[0]], b: [-7] }, "detectors.0.years_observed"],
      [{ source: { ...SOURCE, m2: 0 }, detectors: [{ curve: "lisa" }], networks: [[0]], b: [-7] }, "source.m2"],
      [{ source: { ...SOURCE, chi1: 1 }, detectors: [{ curve: "lisa" }], networks: [[0]], b: [-7] }, "source.chi1"],
      [{ source: { ...SOURCE, distance_mpc: -1 }, detectors: [{ curve: "lisa" }], networks: [[0]], b: [-7] }, "source.distance_mpc"],
      [{ source: { m1: 30, m2: 20 }, detectors: [{ curve: "lisa" }], networks: [[0]], b: [-7] }, "source.distance_mpc"],
      [{ source: SOURCE, detectors: [{ curve: "lisa" }], networks: [[1]], b: [-7] }, "networks.0.0"],
      [{ source: SOURCE, detectors: [{ curve: "lisa" }], networks: [[0]], b: [-7], colour: "red" }, ""],
      [{ source: SOURCE, detectors: [{ curve: "custom:9" }], networks: [[0]], b: [-7] }, "detectors.0.curve"],
    ];
    for (const [body, field] of cases) {
      const res = await request(app).post("/api/v1/forecasts").send(body as object);
      expect(res.status, JSON.stringify(body)).toBe(400);
      if (field) expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(res.body)).toContain(field);
      else expect(JSON.stringify(res.body)).toMatch(/colour/);
    }
  });
});

describe("forecast curves", () => {
  const design = builtInCurve("aligo-design")!;
  const freqs = Array.from({ length: 60 }, (_, i) => 10 * 200 ** (i / 59));
  const table = ["# frequency ASD", "f,asd", ...freqs.map((f) => `${f},${Math.sqrt(design.psd(f, 4))}`)].join("\n");

  it("when anyone lists curves, then the seven built-ins come with source, convention and range", async () => {
    const res = await request(app).get("/api/v1/forecasts/curves");
    expect(res.status).toBe(200);
    const { curves } = curveListSchema.parse(res.body);
    expect(curves.map((c) => c.id)).toEqual(["aligo-design", "aligo-o1", "et-b", "lisa", "tianqin", "decigo", "b-decigo"]);
    expect(curves.find((c) => c.id === "lisa")).toMatchObject({ convention: "response_averaged", space: true, f_max: 1, to_confirm: null });
    // the DECIGO channel convention is our own derivation, not yet checked against Yagi & Seto 2011 section II
    for (const id of ["decigo", "b-decigo"]) expect(curves.find((c) => c.id === id)!.to_confirm).toMatch(/^source to be confirmed/);
  });

  it("when a forecast uses DECIGO, then its band and the cautions say the curve's convention is to be confirmed", async () => {
    const res = await request(app).post("/api/v1/forecasts").send({ source: SOURCE, detectors: [{ curve: "decigo" }], networks: [[0]], b: [-7], translate: false });
    expect(res.status).toBe(200);
    const body = forecastResponseSchema.parse(res.body);
    expect(body.detectors[0]!.to_confirm).toMatch(/source to be confirmed/);
    expect(body.cautions.join(" ")).toMatch(/DECIGO.*source to be confirmed/);
  });

  it("when a user uploads an ASD table, then 201, it is stored as a PSD, listed for them only, usable as custom:<id> and deletable", async () => {
    const up = await request(app).post("/api/v1/forecasts/curves").set("Authorization", auth["t-fc-1"]!).send({ name: "Design, tabulated", kind: "asd", convention: "l_shaped", data: table });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    const curve = curveInfoSchema.parse(up.body);
    expect(curve).toMatchObject({ custom: true, points: 60, f_min: 10 });
    expect(curve.f_max).toBeCloseTo(2000, 6);
    const id = Number(curve.id.split(":")[1]);
    const stored = await tdb.db("forecast_curves").where({ id }).first();
    expect(stored.psd[3] / design.psd(freqs[3]!, 4)).toBeCloseTo(1, 10); // the ASD was squared on the way in

    const mine = curveListSchema.parse((await request(app).get("/api/v1/forecasts/curves").set("Authorization", auth["t-fc-1"]!)).body);
    expect(mine.curves.map((c) => c.id)).toContain(curve.id);
    const theirs = curveListSchema.parse((await request(app).get("/api/v1/forecasts/curves").set("Authorization", auth["t-fc-2"]!)).body);
    expect(theirs.curves.map((c) => c.id)).not.toContain(curve.id);

    // The tabulated design curve gives nearly the analytic answer (log-log interpolation; our own computation)
    const run = await request(app)
      .post("/api/v1/forecasts")
      .set("Authorization", auth["t-fc-1"]!)
      .send({ source: SOURCE, detectors: [{ curve: curve.id }, { curve: "aligo-design" }], networks: [[0], [1]], b: [-7], translate: false });
    expect(run.status, JSON.stringify(run.body).slice(0, 300)).toBe(200);
    const fr = forecastResponseSchema.parse(run.body);
    expect(Math.abs(fr.networks[0]!.snr.total / fr.networks[1]!.snr.total - 1)).toBeLessThan(0.01);
    expect(Math.abs(fr.networks[0]!.rows[0]!.sigma_beta! / fr.networks[1]!.rows[0]!.sigma_beta! - 1)).toBeLessThan(0.01);

    const other = await request(app).post("/api/v1/forecasts").set("Authorization", auth["t-fc-2"]!).send({ source: SOURCE, detectors: [{ curve: curve.id }], networks: [[0]], b: [-7] });
    expect(other.status).toBe(400);
    expect(Object.keys(other.body.error.fields)).toEqual(["detectors.0.curve"]);

    expect((await request(app).delete(`/api/v1/forecasts/curves/${id}`).set("Authorization", auth["t-fc-2"]!)).status).toBe(404);
    expect((await request(app).delete(`/api/v1/forecasts/curves/${id}`).set("Authorization", auth["t-fc-1"]!)).status).toBe(204);
    expect(await tdb.db("forecast_curves").where({ id }).first()).toBeUndefined();
  });

  it("when an upload is bad, then 400 naming the line, and nothing is stored", async () => {
    const before = Number((await tdb.db("forecast_curves").count("id as n"))[0]!.n);
    const send = (data: string, extra = {}) =>
      request(app).post("/api/v1/forecasts/curves").set("Authorization", auth["t-fc-1"]!).send({ name: "bad", kind: "psd", convention: "l_shaped", data, ...extra });
    let res = await send("10 1e-46\n20 1e-46\n15 1e-46");
    expect(res.status).toBe(400);
    expect(res.body.error.fields.data).toMatch(/line 3.*increase/);
    res = await send("10 1e-46\n20 -1e-46");
    expect(res.body.error.fields.data).toMatch(/line 2.*positive/);
    res = await send("10 1e-46\n20 1e-46", { kind: "amplitude" });
    expect(Object.keys(res.body.error.fields)).toEqual(["kind"]);
    expect((await request(app).post("/api/v1/forecasts/curves").send({ name: "x", kind: "psd", convention: "l_shaped", data: "1 1\n2 1" })).status).toBe(401);
    expect(Number((await tdb.db("forecast_curves").count("id as n"))[0]!.n)).toBe(before);
  });
});

describe("POST /api/v1/forecasts/curves (multipart file)", () => {
  const design = builtInCurve("aligo-design")!;
  const freqs = Array.from({ length: 40 }, (_, i) => 10 * 300 ** (i / 39));
  const upload = (file: string | Buffer, fields: Record<string, string> = {}, name = "curve.csv") => {
    let r = request(app).post("/api/v1/forecasts/curves").set("Authorization", auth["t-fc-1"]!);
    for (const [k, v] of Object.entries({ name: "Uploaded", kind: "psd", convention: "l_shaped", ...fields })) r = r.field(k, v);
    return r.attach("file", Buffer.isBuffer(file) ? file : Buffer.from(file), name);
  };

  it("when a PSD file with a comment, a header row and CRLF line ends is uploaded, then 201 and the stored PSD is the file's", async () => {
    const text = ["% Tabulated design curve, invented for this test", "# second comment", "frequency_Hz, psd_per_Hz", ...freqs.map((f) => `${f}, ${design.psd(f, 4)}`)].join("\r\n");
    const res = await upload(text, { space: "false" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const curve = curveInfoSchema.parse(res.body);
    expect(curve).toMatchObject({ custom: true, points: 40, f_min: 10, convention: "l_shaped", space: false });
    const stored = await tdb.db("forecast_curves").where({ id: Number(curve.id.split(":")[1]) }).first();
    expect(stored.uploaded_kind).toBe("psd");
    expect(stored.psd[7] / design.psd(freqs[7]!, 4)).toBeCloseTo(1, 12);
  });

  it("when a file is bad, then 400 naming the line and the column at fault, and nothing is stored", async () => {
    const before = Number((await tdb.db("forecast_curves").count("id as n"))[0]!.n);
    const cases: [string, RegExp, number | undefined, number | null][] = [
      ["f,psd\n10,1e-46\n20,1e-46\n15,1e-46", /line 4, column 1 \(frequency\): frequencies must increase strictly/, 4, 1],
      ["10 1e-46\n20 0", /line 2, column 2 \(PSD\): the PSD must be positive/, 2, 2],
      ["10 1e-46\n20 abc", /line 2, column 2 \(PSD\): "abc" is not a number/, 2, 2],
      ["10 1e-46\nx 1e-46", /line 2, column 1 \(frequency\): "x" is not a number/, 2, 1],
      ["10 1e-46 3", /line 1: expected two columns/, 1, null],
      ["# only one row\n10 1e-46", /too few rows: at least 2/, undefined, null],
    ];
    for (const [text, pattern, line, column] of cases) {
      const res = await upload(text);
      expect(res.status, text).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(["file"]);
      expect(res.body.error.fields.file, text).toMatch(pattern);
      expect(res.body.error.details?.line).toBe(line);
      if (column !== null) expect(res.body.error.details?.column).toBe(column);
    }
    const asd = await upload("10 1e-23\n20 -2e-23", { kind: "asd" });
    expect(asd.body.error.fields.file).toMatch(/column 2 \(ASD\)/);
    const unknown = await upload("10 1e-46\n20 1e-46", { colour: "red" });
    expect(unknown.status).toBe(400);
    expect(JSON.stringify(unknown.body.error)).toMatch(/colour/);
    const noFile = await request(app).post("/api/v1/forecasts/curves").set("Authorization", auth["t-fc-1"]!).field("name", "x").field("kind", "psd").field("convention", "l_shaped");
    expect(noFile.status).toBe(400);
    expect(Object.keys(noFile.body.error.fields)).toEqual(["file"]);
    const binary = await upload(Buffer.from([0xff, 0xfe, 0x00, 0x81, 0x10]));
    expect(binary.status).toBe(400);
    expect(binary.body.error.fields.file).toMatch(/UTF-8/);
    expect(Number((await tdb.db("forecast_curves").count("id as n"))[0]!.n)).toBe(before);
  });
});

describe("POST /api/v1/forecasts/combine", () => {
  it("when per-detector matrices from a forecast are uploaded (one as JSON, one as CSV), then the combined bound equals the forecast's network bound", async () => {
    const fc = forecastResponseSchema.parse(
      (
        await request(app)
          .post("/api/v1/forecasts")
          .send({ source: SOURCE, detectors: [{ curve: "lisa" }, { curve: "aligo-design" }], networks: [[0], [1], [0, 1]], b: [-7], translate: false, include_matrices: true })
      ).body,
    );
    const [lisa, ligo] = fc.matrices![0]!.per_detector;
    const csv = [fc.parameters.join(","), ...ligo!.map((row) => row.map((v) => v.toPrecision(17)).join(","))].join("\n");
    const res = await request(app)
      .post("/api/v1/forecasts/combine")
      .send({ matrices: [{ label: "LISA", parameters: fc.parameters, matrix: lisa }, { label: "aLIGO", csv }] });
    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(200);
    const body = combineResponseSchema.parse(res.body);
    expect(body.networks.map((n) => n.labels)).toEqual([["LISA"], ["aLIGO"], ["LISA", "aLIGO"]]);
    body.networks.forEach((n, i) => expect(n.sigma! / fc.networks[i]!.rows[0]!.sigma_beta!).toBeCloseTo(1, 8));
    expect(body.priors_applied).toEqual({ phi_c: Math.PI, chi_s: 1, chi_a: 1 });
  });

  it("when a matrix is asymmetric, indefinite, badly named or malformed, then 400 naming it", async () => {
    const names = ["a", "beta"];
    const send = (matrices: unknown) => request(app).post("/api/v1/forecasts/combine").send({ matrices });
    let res = await send([{ parameters: names, matrix: [[2, 1], [0.5, 3]] }]);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)[0]).toMatch(/^matrices\.0\.matrix/);
    res = await send([{ parameters: names, matrix: [[1, 2], [2, 1]] }]);
    expect(res.body.error.message).toMatch(/not positive definite/);
    res = await send([{ parameters: names, matrix: [[2, 0], [0, 2]] }, { parameters: ["b", "beta"], matrix: [[2, 0], [0, 2]] }]);
    expect(Object.keys(res.body.error.fields)).toEqual(["matrices.1.parameters"]);
    res = await send([{ csv: "a,beta\n1,0\nx,1" }]);
    expect(res.body.error.fields["matrices.0.csv"]).toMatch(/line 3/);
    res = await send([{ parameters: ["a", "b"], matrix: [[1, 0], [0, 1]] }]);
    expect(Object.keys(res.body.error.fields)).toEqual(["target"]);
  });
});
