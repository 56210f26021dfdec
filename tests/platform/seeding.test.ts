import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedSteps, type SeedStep } from "../../seeds/index.ts";
import { createTestDatabase, truncateAll, type TestDatabase } from "../helpers/db.ts";

describe("seedSteps", () => {
  let tdb: TestDatabase;
  beforeAll(async () => {
    tdb = await createTestDatabase();
  });
  afterAll(async () => {
    await tdb.drop();
  });

  const marker = (name: string): SeedStep => ({
    name,
    run: async (trx) => {
      await trx("seed_runs").insert({ name: `${name}:ran` });
    },
  });

  it("when a step fails half-way, then nothing of the seed is left behind", async () => {
    await truncateAll(tdb.db);
    const boom: SeedStep = {
      name: "boom",
      run: () => Promise.reject(new Error("interrupted")),
    };
    await expect(seedSteps(tdb.db, [marker("first"), boom])).rejects.toThrow("interrupted");
    expect(await tdb.db("seed_runs").count<{ count: string }[]>("* as count")).toEqual([{ count: "0" }]);
  });

  it("when seeded twice, then each step runs once; a step added later runs once on the next start", async () => {
    await truncateAll(tdb.db);
    expect(await seedSteps(tdb.db, [marker("a")])).toEqual(["a"]);
    expect(await seedSteps(tdb.db, [marker("a")])).toEqual([]);
    expect(await seedSteps(tdb.db, [marker("a"), marker("b")])).toEqual(["b"]);
    const names = (await tdb.db("seed_runs").select<{ name: string }[]>("name").orderBy("name")).map((r) => r.name);
    expect(names).toEqual(["a", "a:ran", "b", "b:ran"]);
  });
});
