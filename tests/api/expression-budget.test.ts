import type { Server } from "node:http";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeSymbolicPool } from "../../server/physics/expr/pool.ts";
import { buildTestApp } from "../helpers/app.ts";
import { listen } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { craftedDefinitionChecks } from "../helpers/hostile-corpus.ts";

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
});
afterAll(async () => {
  await closeSymbolicPool();
  await tdb.drop();
});

describe("POST /api/v1/expressions/check: the evaluation budget", () => {
  for (const crafted of craftedDefinitionChecks()) {
    it(`when the expression is ${crafted.label}, then 400 naming the field with its substituted size and the limit`, async () => {
      const res = await request(app).post("/api/v1/expressions/check").send(crafted.body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe("invalid_expression");
      const field = crafted.body.derivation ? "derivation.flux.coefficient" : "expression";
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
      const size = res.body.error.details.size as number;
      // u expands to 19 863 nodes (see craftedDefinitionChecks): hundreds of uses are millions of nodes.
      expect(size).toBeGreaterThan(1_000_000);
      expect(res.body.error.details.cap).toBe(20_000);
      expect(res.body.error.fields[field]).toContain(`${field} is too large to evaluate`);
      expect(res.body.error.fields[field]).toContain(`${size} nodes, over the limit of 20000`);
    });
  }

  it("when the same definitions are used a few times, then the check runs and reports (the budget counts uses, not declarations)", async () => {
    const [first] = craftedDefinitionChecks();
    const res = await request(app).post("/api/v1/expressions/check").send({ ...first?.body, expression: "alpha*w2/M" });
    expect(res.status).toBe(200);
    expect(res.body.checks.map((c: { name: string }) => c.name)).toEqual(expect.arrayContaining(["parse", "symbols", "dimension", "gr_limit"]));
  });
});

describe("GET /api/health while crafted expressions are sent", () => {
  let server: Server;
  let url: string;
  beforeAll(async () => {
    ({ server, url } = await listen(app));
  });
  afterAll(async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
  });

  it("when four clients send the crafted expressions in a loop, then health answers, with the database up, while they are in flight", async () => {
    const crafted = craftedDefinitionChecks();
    let inFlight = 0;
    let attackOver = false;
    const statuses: number[] = [];
    const healthDuringAttack: Array<{ status: number; db: unknown }> = [];
    const client = async (offset: number) => {
      for (let k = 0; k < 15; k += 1) {
        const c = crafted[(k + offset) % crafted.length];
        inFlight += 1;
        const res = await fetch(`${url}/api/v1/expressions/check`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(c?.body) });
        await res.arrayBuffer();
        inFlight -= 1;
        statuses.push(res.status);
      }
    };
    const poll = async () => {
      while (!attackOver) {
        const res = await fetch(`${url}/api/health`);
        const body = (await res.json()) as { db: unknown };
        // Counted only when a crafted request was sent and not yet answered when health answered.
        if (inFlight > 0) healthDuringAttack.push({ status: res.status, db: body.db });
      }
    };
    const polling = poll();
    await Promise.all([0, 1, 2, 3].map(client));
    attackOver = true;
    await polling;
    expect(statuses).toHaveLength(60);
    // Four clients from one address: beyond its in-flight limit an address gets 429 at once.
    expect(statuses.every((s) => s === 400 || s === 429)).toBe(true);
    expect(statuses.filter((s) => s === 400).length).toBeGreaterThan(0);
    expect(healthDuringAttack.length).toBeGreaterThan(0);
    expect(healthDuringAttack.every((h) => h.status === 200 && h.db === "up")).toBe(true);
  });
});
