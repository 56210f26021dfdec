import request from "supertest";
import { afterAll, beforeAll, expect } from "vitest";
import { convertResponseSchema, type ConvertResponse, type ConvertResult } from "../../common/convert.ts";
import type { SeedStep } from "../../seeds/index.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "./app.ts";
import { createTestDatabase, type TestDatabase } from "./db.ts";

/** IAU 2015 B3 nominal (G M)_sun and exact c: G M_sun / c^2 in km. */
export const KM_PER_MSUN = 1.3271244e20 / 299_792_458 ** 2 / 1000;

/** Relative difference of a from b. */
export const rel = (a: number, b: number) => Math.abs(a / b - 1);

export interface ConvertSuite {
  /** The app (after beforeAll has built it). */
  app(): DragomanApp;
  /** POST /api/v1/convert, expecting 200, the body read with the response schema. */
  convert(body: object): Promise<ConvertResponse>;
  /** The result row of one theory (and coupling symbol), or an error quoting why it is not applicable. */
  resultFor(r: ConvertResponse, theory: string, symbol?: string): ConvertResult;
  /** POST /api/v1/convert, expecting 400: the fields it names. */
  refused(body: object): Promise<Record<string, string>>;
}

/**
 * For a describe block translating bounds through a catalogue: a database of its own with the given
 * seed steps run in one transaction, an app on it, dropped after the block; and the calls the tests make.
 */
export function convertSuite(seeds: readonly SeedStep[]): ConvertSuite {
  let tdb: TestDatabase | undefined;
  let built: DragomanApp | undefined;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction(async (trx) => {
      for (const seed of seeds) await seed.run(trx);
    });
    built = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
  }, 120_000);
  afterAll(async () => {
    await tdb?.drop();
  });
  const app = (): DragomanApp => {
    if (!built) throw new Error("convertSuite: the app is built in beforeAll");
    return built;
  };
  return {
    app,
    async convert(body) {
      const res = await request(app()).post("/api/v1/convert").send(body);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return convertResponseSchema.parse(res.body);
    },
    resultFor(r, theory, symbol) {
      const found = r.results.find((x) => x.theory === theory && (symbol === undefined || x.coupling_symbol === symbol));
      if (!found) throw new Error(`no result for ${theory} ${symbol ?? ""}; not applicable: ${JSON.stringify(r.not_applicable.filter((n) => n.theory === theory))}`);
      return found;
    },
    async refused(body) {
      const res = await request(app()).post("/api/v1/convert").send(body);
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      return res.body.error.fields as Record<string, string>;
    },
  };
}
