import request from "supertest";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { SymbolicPool } from "../../server/physics/expr/pool.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

// EdGB dipole term with the derivation from the dipole flux (normalisation derived; Yagi 2012,
// PRD 86 081504): the numbers agree, so the derivation check asks the CAS to confirm.
const EDGB = {
  expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
  target: "ppe_phase",
  b: -7,
  pn_order: -1,
  couplings: [{ symbol: "alpha", dimension: 2 }],
  definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
  derivation: { flux: { order: -1, coefficient: "(5/96)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^4)" } },
};

/** A CAS that never answers: a check that needs it can only end at the check worker's time limit. */
const silentCas = () => new SymbolicPool({ transport: () => new Promise(() => undefined) });

let tdb: TestDatabase;
const apps: DragomanApp[] = [];
const token: Record<string, string> = {};
beforeAll(async () => {
  tdb = await createTestDatabase();
  for (const login of ["w-one", "w-two", "w-three"]) {
    await ensureUser(tdb.db, { login, roles: ["contributor"] });
    token[login] = await bearerFor(tdb.db, login);
  }
});
afterAll(async () => {
  await Promise.all(apps.map((a) => a.locals.checkPool.close()));
  await tdb.drop();
});

function appWith(overrides: Record<string, string>): DragomanApp {
  const app = buildTestApp(tdb, overrides, { symbolicPool: silentCas() });
  apps.push(app);
  return app;
}

describe("POST /api/v1/expressions/check: check workers", () => {
  it("when a check outlives the worker's time limit, then it is inconclusive, never failed, and the finished checks are kept", async () => {
    const app = appWith({ CHECK_TIMEOUT_MS: "1500" });
    const res = await request(app).post("/api/v1/expressions/check").send(EDGB);
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    const byName = new Map<string, { ok: boolean; severity?: string; message: string }>(res.body.checks.map((c: { name: string }) => [c.name, c]));
    // Dimension and GR limit finished before the derivation waited on the CAS: they stand as they are.
    expect(byName.get("dimension")).toMatchObject({ ok: true });
    expect(byName.get("gr_limit")).toMatchObject({ ok: true });
    expect(byName.get("evaluation")).toMatchObject({ ok: false, severity: "inconclusive" });
    expect(byName.get("evaluation")?.message).toContain("time limit of 1500 ms");
    expect(byName.get("evaluation")?.message).toContain("not a failure");
    expect(res.body.checks.filter((c: { severity?: string }) => c.severity === "error")).toEqual([]);
  });

  it("when an address already has its checks in flight, then 429 with Retry-After, at once", async () => {
    const app = appWith({ CHECK_TIMEOUT_MS: "4000", CHECK_IN_FLIGHT_PER_CLIENT: "1" });
    const first = request(app).post("/api/v1/expressions/check").send(EDGB).then((r) => r);
    await vi.waitFor(() => expect(app.locals.checkPool.stats().running).toBe(1), { timeout: 10_000 });
    const second = await request(app).post("/api/v1/expressions/check").send(EDGB);
    expect(second.status).toBe(429);
    expect(Number(second.headers["retry-after"])).toBeGreaterThan(0);
    expect(second.body.error.message).toMatch(/already have 1 expression check running \(the limit is 1 at a time\)/);
    // Another client is not held back by it.
    const other = await request(app).post("/api/v1/expressions/check").set("Authorization", `Bearer ${token["w-one"]}`).send({ ...EDGB, derivation: undefined });
    expect(other.status).toBe(200);
    expect((await first).status).toBe(200);
  });

  it("when the queue of waiting checks is full, then 503 with Retry-After", async () => {
    const app = appWith({ CHECK_TIMEOUT_MS: "4000", CHECK_WORKERS: "1", CHECK_QUEUE_MAX: "1" });
    const as = (login: string) => request(app).post("/api/v1/expressions/check").set("Authorization", `Bearer ${token[login]}`).send(EDGB);
    const running = as("w-one").then((r) => r);
    await vi.waitFor(() => expect(app.locals.checkPool.stats().running).toBe(1), { timeout: 10_000 });
    const waiting = as("w-two").then((r) => r);
    await vi.waitFor(() => expect(app.locals.checkPool.stats().queued).toBe(1), { timeout: 10_000 });
    const refused = await as("w-three");
    expect(refused.status).toBe(503);
    expect(Number(refused.headers["retry-after"])).toBeGreaterThan(0);
    expect(refused.body.error.message).toMatch(/busy/);
    expect((await running).status).toBe(200);
    expect((await waiting).status).toBe(200);
  });
});
