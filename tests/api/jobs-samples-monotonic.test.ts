import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { KM_PER_MSUN } from "../helpers/convert.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { submitSamples } from "../helpers/jobs.ts";
import { filled, gaussian, toCsv } from "../helpers/samples-data.ts";

/**
 * POST /api/v1/jobs/samples with a mapping that is not a power law in its coupling: when beta rises
 * and falls in the coupling for every plausible binary, the request is refused with 400 naming the
 * mapping and where it turns, before anything is stored or queued; a monotonic one is queued. The
 * varying-G entry's mapping is replaced in the database by shapes whose turning point is known in
 * closed form (y = Gdot Mc, A = 275/851968, Mc the source-frame chirp mass in km).
 */

const n = 2000;
const csv = toCsv({ beta: gaussian(5, n, -1e-5, 1e-5), m1: filled(n, 10), m2: filled(n, 5) });
const settings = { theory: "varying-g", parameter: "ppe_beta", b: -13, credibility: 0.9, frame: "source", columns: { deviation: "beta", m1: "m1", m2: "m2" } };
const mcKm = (m1: number, m2: number) => ((m1 * m2) ** 0.6 / (m1 + m2) ** 0.2) * KM_PER_MSUN;

describe("POST /api/v1/jobs/samples with a mapping that is not monotonic in its coupling", () => {
  let tdb: TestDatabase;
  let app: DragomanApp;

  beforeAll(async () => {
    tdb = await createTestDatabase();
    await tdb.db.transaction((trx) => catalogueSeed.run(trx));
    app = buildTestApp(tdb, { JOBS_ANON_PER_HOUR: "1000" });
  });
  afterAll(async () => {
    await app?.locals.jobQueue.stop();
    await tdb?.drop();
  });

  /** Replaces varying-G's b = -13 expression; touching updated_at gives the catalogue a new revision, so the server recompiles it. */
  async function useShape(expression: string): Promise<void> {
    const theory = await tdb.db("theories").where({ slug: "varying-g" }).first<{ id: number }>("id");
    const updated = await tdb.db("mappings").where({ theory_id: theory!.id, b: -13 }).update({ expression });
    expect(updated).toBe(1);
    await tdb.db("theories").where({ id: theory!.id }).update({ updated_at: tdb.db.fn.now() });
  }
  const jobCount = async () => Number((await tdb.db("analysis_jobs").count<{ count: string }[]>("* as count"))[0]!.count);

  it("when beta = -A y (1 - y) turns at y = 1/2 for every binary, then the job is refused with 400 naming the mapping and the turning point, and nothing is stored", async () => {
    await useShape("-(275/851968)*Gdot*Mc*(1 - Gdot*Mc)");
    const res = await submitSamples(app, csv, "turns.csv", settings);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    const why = res.body.error.fields.theory as string;
    expect(why).toMatch(/^the varying-g mapping at b = -13 is not monotonic in Ġ\/G: for a 10 \+ 5 M☉ bh-bh binary, beta turns at Ġ\/G ≈ (\S+) 1\/km/);
    // dF/dy = -A (1 - 2y) vanishes at y = 1/2 (derived): Gdot = 1 / (2 Mc) for the named 10 + 5 M☉ binary.
    const turn = Number(/turns at Ġ\/G ≈ (\S+) 1\/km/.exec(why)![1]);
    expect(Math.abs(turn / (1 / (2 * mcKm(10, 5))) - 1)).toBeLessThan(2e-3);
    expect(why).toMatch(/1\/km \(\|Ġ\/G\| ≈ \S+ 1\/yr\), and it turns for every one of the 4 plausible bh-bh binaries tried/);
    expect(res.body.error.message).toMatch(/^Invalid theory: /);
    expect(await jobCount()).toBe(0);
  });

  it("when the bodies are neutron stars, then the probes are neutron-star binaries and the turning point moves with their chirp mass", async () => {
    await useShape("-(275/851968)*Gdot*Mc*(1 - Gdot*Mc)");
    const res = await submitSamples(app, csv, "turns-ns.csv", { ...settings, bodies: ["ns", "ns"] });
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    const why = res.body.error.fields.theory as string;
    const m = /for a (\S+) \+ (\S+) M☉ ns-ns binary, beta turns at Ġ\/G ≈ (\S+) 1\/km/.exec(why);
    expect(m, why).not.toBeNull();
    expect(Math.abs(Number(m![3]) / (1 / (2 * mcKm(Number(m![1]), Number(m![2])))) - 1)).toBeLessThan(2e-3);
    expect(await jobCount()).toBe(0);
  });

  it("when beta turns for some plausible binaries only (-A y (1 - chi1 y): monotonic at chi1 = 0), then the job is queued and its own rows decide", async () => {
    await useShape("-(275/851968)*Gdot*Mc*(1 - chi1*Gdot*Mc)");
    const res = await submitSamples(app, csv, "sometimes.csv", settings);
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    expect(await jobCount()).toBe(1);
  });

  it("when beta = -A (y + y^3) is monotonic over both signs though not a power law, then the job is queued as before", async () => {
    await useShape("-(275/851968)*(Gdot*Mc + (Gdot*Mc)^3)");
    const res = await submitSamples(app, csv, "monotonic.csv", settings);
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    expect(res.body.job.status).toBe("queued");
    expect(await jobCount()).toBe(2);
  });
});
