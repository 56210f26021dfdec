import request from "supertest";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { MAX_SAMPLES, samplesRequestSchema, samplesResponseSchema } from "../../common/convert-samples.ts";
import { convertSamples } from "../../server/features/convert/samples.ts";
import { BodyPool } from "../../server/http/body-pool.ts";
import { IN_THREAD_MAX_BYTES } from "../../server/http/json-body.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { gaussian } from "../helpers/samples-data.ts";
import { seedCatalogue } from "./convert-fixture.ts";

/**
 * POST /api/v1/convert/samples with JSON bodies large enough to be read in the body worker thread
 * (server/http/body-pool.ts) rather than on the event loop: a 20 000-row posterior arrives intact
 * (the same bound as the same columns converted in this process), and every refusal still names its
 * field and row as the in-thread path does.
 */

const n = MAX_SAMPLES;
const columns = {
  beta: Array.from(gaussian(21, n, 0, 2e-3)),
  m1: Array.from(gaussian(22, n, 12, 1), (v) => Math.max(v, 6)),
  m2: Array.from(gaussian(23, n, 6, 0.5), (v) => Math.max(v, 3)),
  chi1: Array.from(gaussian(24, n, 0.1, 0.05)),
};
const base = { theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source" };

describe("POST /api/v1/convert/samples with large JSON bodies (read in the body worker)", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;
  const reads = vi.spyOn(BodyPool.prototype, "read");

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  });
  afterAll(async () => {
    reads.mockRestore();
    await tdb?.drop();
  });

  const post = (body: string | object, type = "application/json") => request(app).post("/api/v1/convert/samples").set("Content-Type", type).send(typeof body === "string" ? body : JSON.stringify(body));

  it("when a 20 000-row posterior is sent as JSON, then it is read in the worker and arrives intact: the same bound, counts and histogram as the same columns converted here", async () => {
    const body = { ...base, columns };
    const text = JSON.stringify(body);
    expect(text.length).toBeGreaterThan(IN_THREAD_MAX_BYTES);
    reads.mockClear();
    const res = await post(text);
    expect(res.status, JSON.stringify(res.body).slice(0, 400)).toBe(200);
    expect(reads).toHaveBeenCalledTimes(1);
    expect(reads.mock.calls[0]![0]).toBe("convert-samples");
    const got = samplesResponseSchema.parse(res.body);
    const here = await convertSamples(seedCatalogue(), samplesRequestSchema.parse(body));
    expect(got.samples).toEqual(here.samples);
    expect(got.samples.total).toBe(n);
    expect(got.coupling.value).toBe(here.coupling.value);
    expect(got.histogram).toEqual(here.histogram);
    expect(got.validity).toEqual(here.validity);
  });

  it("when a small body is sent, then it is read on the request thread, not handed to the worker", async () => {
    reads.mockClear();
    const res = await post({ ...base, columns: { beta: [1e-3, 2e-3], m1: [10, 11], m2: [5, 6] } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(reads).not.toHaveBeenCalled();
  });

  it("when a large body holds a bad cell, a wrong length or a bad field, then the 400 names the column and row or the field, as for a small one", async () => {
    reads.mockClear();
    const m1 = [...columns.m1];
    m1[15_000] = -3;
    const negative = await post({ ...base, columns: { ...columns, m1 } });
    expect(negative.status).toBe(400);
    expect(negative.body.error.fields["columns.m1.15000"]).toMatch(/row 15000/);

    const notNumber = await post({ ...base, columns: { ...columns, m2: [...columns.m2.slice(0, 17_321), "x", ...columns.m2.slice(17_322)] } });
    expect(notNumber.status).toBe(400);
    expect(Object.keys(notNumber.body.error.fields)).toEqual(["columns.m2.17321"]);
    expect(notNumber.body.error.code).toBe("validation_failed");

    const short = await post({ ...base, columns: { ...columns, chi1: columns.chi1.slice(1) } });
    expect(short.status).toBe(400);
    expect(short.body.error.fields["columns.chi1"]).toMatch(/same length/);

    const unknown = await post({ ...base, columns, colour: "blue" });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.colour).toMatch(/unknown field "colour"/);

    const nul = await post({ ...base, columns, theory: "ed\u0000gb" });
    expect(nul.status).toBe(400);
    expect(nul.body.error.fields).toEqual({ theory: "contains a NUL character (U+0000)" });
    // Each of the five went through the worker.
    expect(reads).toHaveBeenCalledTimes(5);
  });

  it("when a large body is not valid JSON, or not an object, then 400 malformed_json, as express.json answers", async () => {
    const text = JSON.stringify({ ...base, columns });
    const cut = await post(text.slice(0, -10));
    expect(cut.status).toBe(400);
    expect(cut.body.error).toMatchObject({ code: "malformed_json", fields: { body: "not valid JSON" } });
    const scalar = await post(`   ${JSON.stringify("x".repeat(IN_THREAD_MAX_BYTES + 10))}`);
    expect(scalar.status).toBe(400);
    expect(scalar.body.error.code).toBe("malformed_json");
  });

  it("when a JSON body declares a charset other than UTF-8, then 415 naming it", async () => {
    const res = await post({ ...base, columns: { beta: [1e-3], m1: [10], m2: [5] } }, "application/json; charset=latin1");
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/charset "latin1"/);
  });
});
