import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { openApiPath, operationId } from "../../server/openapi/generate.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

type Json = Record<string, unknown>;
let tdb: TestDatabase;
let app: DragomanApp;
let doc: Json & { paths: Record<string, Record<string, Json>>; components: { schemas: Record<string, Json> } };

beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
  const res = await request(app).get("/api/v1/openapi.json");
  expect(res.status).toBe(200);
  doc = res.body;
});
afterAll(async () => {
  await tdb.drop();
});

function refsIn(value: unknown, out: string[] = []): string[] {
  if (Array.isArray(value)) value.forEach((v) => refsIn(v, out));
  else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (k === "$ref" && typeof v === "string") out.push(v);
      else refsIn(v, out);
    }
  }
  return out;
}

describe("GET /api/v1/openapi.json", () => {
  it("when fetched anonymously, then an OpenAPI 3.1 document", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.info).toMatchObject({ title: "Dragoman API" });
    expect(doc.components).toHaveProperty("securitySchemes.bearerToken");
  });

  it("when compared with the route table, then every route is an operation, and there are no others", () => {
    const routes = app.locals.routeTable.routes;
    expect(routes.length).toBeGreaterThan(20);
    for (const r of routes) {
      const op = doc.paths[openApiPath(r.fullPath)]?.[r.method];
      expect(op, `${r.method.toUpperCase()} ${r.fullPath}`).toBeDefined();
      expect(op?.operationId).toBe(operationId(r));
      expect(op?.summary).toBe(r.summary);
      expect((op?.["x-access"] as Json).kind).toBe(r.access.kind);
      const security = op?.security as unknown[];
      if (r.access.kind === "public" || r.access.kind === "dev_only") expect(security).toEqual([]);
      else expect(security).toEqual([{ sessionCookie: [] }, { bearerToken: [] }]);
      if (r.access.kind === "roles") expect((op?.["x-access"] as Json).roles).toEqual([...r.access.roles]);
      if (r.access.kind !== "public") expect(Object.keys(op?.responses as Json)).toEqual(expect.arrayContaining([r.access.kind === "dev_only" ? "403" : "401"]));
    }
    const operations = Object.values(doc.paths).flatMap((p) => Object.keys(p));
    expect(operations).toHaveLength(routes.length);
    const ids = Object.values(doc.paths).flatMap((p) => Object.values(p).map((o) => o.operationId));
    expect(new Set(ids).size).toBe(ids.length);
  });

  it("when a path has Express parameters, then they are {braced} and declared as path parameters", () => {
    expect(doc.paths).not.toHaveProperty(["/api/v1/theories/:slug"]);
    const op = doc.paths["/api/v1/theories/{slug}/revisions/{n}"]?.get;
    expect(op?.parameters).toEqual([
      { name: "slug", in: "path", required: true, schema: { type: "string" } },
      { name: "n", in: "path", required: true, schema: { type: "string" } },
    ]);
  });

  it("when a route has body, query and response schemas, then they appear as components from zod (z.toJSONSchema)", () => {
    const create = doc.paths["/api/v1/submissions"]?.post as Json & { requestBody: Json; responses: Record<string, Json> };
    expect(Object.keys(create.responses)).toEqual(expect.arrayContaining(["201", "400", "401", "403", "409"]));
    const bodyRef = (create.requestBody as { content: { "application/json": { schema: { $ref: string } } } }).content["application/json"].schema.$ref;
    const body = doc.components.schemas[bodyRef.split("/").pop() as string] as { properties: Record<string, { properties: Record<string, Json> }>; required: string[] };
    expect(body.required).toEqual(["theory"]);
    expect(Object.keys(body.properties.theory?.properties ?? {})).toEqual(expect.arrayContaining(["slug", "couplings", "mappings", "references"]));
    expect(JSON.stringify(body.properties.theory?.properties.mappings)).toContain("inspiral_phase");

    const list = doc.paths["/api/v1/theories"]?.get as { parameters: { name: string; in: string; schema: Json }[] };
    const family = list.parameters.find((p) => p.name === "family");
    expect(family).toMatchObject({ in: "query", required: false });
    expect(family?.schema.enum).toContain("scalar-tensor");
    expect(list.parameters.map((p) => p.name)).toEqual(expect.arrayContaining(["b", "text"]));

    const bib = doc.paths["/api/v1/references/bibtex"]?.get as { responses: Record<string, { content: Record<string, unknown> }> };
    expect(Object.keys(bib.responses["200"]?.content ?? {})).toEqual(["application/x-bibtex"]);
  });

  it("when references are followed, then every $ref resolves to a component", () => {
    const refs = refsIn(doc.paths);
    expect(refs.length).toBeGreaterThan(20);
    for (const ref of refs) {
      expect(ref.startsWith("#/components/schemas/"), ref).toBe(true);
      expect(doc.components.schemas, ref).toHaveProperty([ref.replace("#/components/schemas/", "")]);
    }
  });
});
