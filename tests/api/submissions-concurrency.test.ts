import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TheoryEntryInput } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { toyEntry } from "./catalogue-fixtures.ts";

let tdb: TestDatabase;
let app: DragomanApp;
const tokens: Record<string, string> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
  for (const [login, role] of [["c-author", "contributor"], ["c-ed-one", "editor"], ["c-ed-two", "editor"]] as const) {
    await ensureUser(tdb.db, { login, roles: [role] });
    tokens[login] = await bearerFor(tdb.db, login);
  }
});
afterAll(async () => {
  await tdb.drop();
});

const as = (login: string) => ({ Authorization: `Bearer ${tokens[login]}` });

describe("PATCH /api/v1/submissions/:id by two editors at once", () => {
  it("when both save the same version, then one gets 200 and the other 409 naming the newer version; after re-reading, the second saves too and nothing is lost", async () => {
    const created = await request(app).post("/api/v1/submissions").set(as("c-author")).send({ theory: toyEntry({ slug: "race" }) });
    expect(created.status).toBe(201);
    const id = created.body.id as number;
    await request(app).post(`/api/v1/submissions/${id}/submit`).set(as("c-author"));
    expect((await request(app).post(`/api/v1/submissions/${id}/start-review`).set(as("c-ed-one"))).body.status).toBe("in_review");

    const base = toyEntry({ slug: "race" });
    const one: TheoryEntryInput = { ...base, summary: "Summary tightened by editor one." };
    const two: TheoryEntryInput = { ...base, assumptions: ["leading PN order only (added by editor two)"] };
    const [a, b] = await Promise.all([
      request(app).patch(`/api/v1/submissions/${id}`).set(as("c-ed-one")).send({ version: 1, theory: one }),
      request(app).patch(`/api/v1/submissions/${id}`).set(as("c-ed-two")).send({ version: 1, theory: two }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const [won, lost, lostEntry, lostLogin] = a.status === 200 ? [a, b, two, "c-ed-two"] : [b, a, one, "c-ed-one"];
    expect(won.body.version).toBe(2);
    expect(lost.body.error.details).toMatchObject({ current_version: 2, your_version: 1 });
    expect(lost.body.error.message).toMatch(/version 2/);

    // The loser re-reads, reapplies their own change on top, and saves from version 2.
    const fresh = await request(app).get(`/api/v1/submissions/${id}`).set(as(lostLogin));
    expect(fresh.body.version).toBe(2);
    const merged: TheoryEntryInput = { ...fresh.body.theory, ...(lostEntry === one ? { summary: one.summary } : { assumptions: two.assumptions }) };
    const retry = await request(app).patch(`/api/v1/submissions/${id}`).set(as(lostLogin)).send({ version: 2, theory: merged });
    expect(retry.status).toBe(200);
    expect(retry.body.version).toBe(3);

    const row = await tdb.db("submissions").where({ id }).first();
    expect(row.version).toBe(3);
    expect(row.entry.summary).toBe(one.summary);
    expect(row.entry.assumptions).toEqual(two.assumptions);
    const saves = await tdb.db("submission_events").where({ submission_id: id, action: "save" }).orderBy("id").pluck("version");
    expect(saves).toEqual([2, 3]);
  });
});
