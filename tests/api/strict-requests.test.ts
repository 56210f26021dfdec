import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { z } from "zod";
import type { MountedRoute } from "../../server/http/route.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * Every request schema in the API is strict: an unknown field is a 400 naming it, never silently
 * dropped. The route table is read at run time, so routes added later are covered without edits here.
 */

interface Def {
  type: string;
  shape?: Record<string, z.ZodType>;
  catchall?: z.ZodType;
  innerType?: z.ZodType;
  in?: z.ZodType;
  out?: z.ZodType;
  element?: z.ZodType;
  items?: z.ZodType[];
  rest?: z.ZodType | null;
  options?: z.ZodType[];
  valueType?: z.ZodType;
  left?: z.ZodType;
  right?: z.ZodType;
  getter?: () => z.ZodType;
}

const defOf = (s: z.ZodType): Def => (s as unknown as { _zod: { def: Def } })._zod.def;

/** Paths of every object in the schema that accepts unknown keys (catchall other than never). */
export function looseObjects(schema: z.ZodType, path = "", seen = new Set<z.ZodType>()): string[] {
  if (seen.has(schema)) return [];
  seen.add(schema);
  const d = defOf(schema);
  const here = path || "(root)";
  const walk = (s: z.ZodType | null | undefined, p: string) => (s ? looseObjects(s, p, seen) : []);
  switch (d.type) {
    case "object": {
      const strict = d.catchall !== undefined && defOf(d.catchall).type === "never";
      return [...(strict ? [] : [here]), ...Object.entries(d.shape ?? {}).flatMap(([k, v]) => walk(v, path ? `${path}.${k}` : k))];
    }
    case "optional":
    case "nullable":
    case "default":
    case "prefault":
    case "readonly":
    case "catch":
    case "nonoptional":
      return walk(d.innerType, path);
    case "pipe":
      return [...walk(d.in, path), ...walk(d.out, path)];
    case "array":
      return walk(d.element, `${path}[]`);
    case "tuple":
      return [...(d.items ?? []).flatMap((s, i) => walk(s, `${path}.${i}`)), ...walk(d.rest, `${path}[]`)];
    case "union":
      return (d.options ?? []).flatMap((s) => walk(s, path));
    case "record":
      return walk(d.valueType, `${path}.*`);
    case "intersection":
      return [...walk(d.left, path), ...walk(d.right, path)];
    case "lazy":
      return d.getter ? walk(d.getter(), path) : [];
    default:
      return [];
  }
}

describe("strict request schemas", () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof buildTestApp>;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb);
  });
  afterAll(async () => {
    await tdb?.drop();
  });

  it("when the route table is read, then every body and query schema refuses unknown fields at every level", () => {
    const routes: MountedRoute[] = app.locals.routeTable.routes;
    const withSchemas = routes.filter((r) => r.body || r.query);
    expect(withSchemas.length).toBeGreaterThan(10);
    const loose = withSchemas.flatMap((r) => [
      ...(r.body ? looseObjects(r.body).map((p) => `${r.method.toUpperCase()} ${r.fullPath} body ${p}`) : []),
      ...(r.query ? looseObjects(r.query).map((p) => `${r.method.toUpperCase()} ${r.fullPath} query ${p}`) : []),
    ]);
    expect(loose).toEqual([]);
  });

  it("when a loose object is given to the walker, then it is found (the check can fail)", () => {
    expect(looseObjects(z.strictObject({ a: z.object({ b: z.number() }).optional() }))).toEqual(["a"]);
    expect(looseObjects(z.strictObject({ a: z.array(z.strictObject({ b: z.number() })) }))).toEqual([]);
  });

  it("when a translation request carries an unknown field, then 400 names it at its own path and nothing is translated", async () => {
    const base = { bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } };
    const cases: [object, string][] = [
      [{ ...base, extra: 1 }, "extra"],
      [{ ...base, bound: { ...base.bound, lower: -1e-3 } }, "bound.lower"],
      [{ ...base, binary: { ...base.binary, spin1: 0.3 } }, "binary.spin1"],
      [{ ...base, cosmology: { H0: 70, Omega_l: 0.7 } }, "cosmology.Omega_l"],
    ];
    for (const [body, field] of cases) {
      const res = await request(app).post("/api/v1/convert").send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.fields[field], JSON.stringify(res.body)).toMatch(/unknown field/);
      expect(res.body.results).toBeUndefined();
    }
    const table = await request(app).post("/api/v1/convert/table").send({ rows: [{ b: -7, upper: 1e-3, sigma: 2 }], binary: base.binary, credibility: 0.9 });
    expect(table.status).toBe(400);
    expect(table.body.error.fields["rows.0.sigma"]).toMatch(/unknown field/);
    const events = await request(app)
      .post("/api/v1/convert/events")
      .send({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, events: [{ label: "KV-1", binary: base.binary, upper: 1e-5, weight: 2 }] });
    expect(events.status).toBe(400);
    expect(events.body.error.fields["events.0.weight"]).toMatch(/unknown field/);
  });
});
