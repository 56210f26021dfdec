import request from "supertest";
import { theoryBySlug } from "../../seeds/data/theories.ts";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { accountsSeed } from "../../seeds/accounts.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { demoScenarioSeed } from "../../seeds/demo-scenario.ts";
import { seedDemo } from "../../seeds/index.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
beforeAll(async () => {
  tdb = await createTestDatabase();
}, 120_000);
afterAll(async () => {
  await tdb.drop();
});

describe("seeds: catalogue and demo scenario", () => {
  it("when seeded, then the invented review scenario is in place: in review with comments, returned with the editor's comment, submitted, draft", async () => {
    expect(await seedDemo(tdb.db, [accountsSeed, catalogueSeed, demoScenarioSeed])).toBe("seeded");
    const rows = await tdb.db("submissions as s").join("users as u", "u.id", "s.author_id").leftJoin("theories as t", "t.id", "s.target_theory_id").orderBy("s.id").select("s.id", "s.status", "u.login", "t.slug");
    expect(rows.map((r) => [r.login, r.slug, r.status])).toEqual([
      ["demo-theorist", "edgb", "in_review"],
      ["demo-phenomenologist", "massive-graviton", "returned"],
      ["demo-postdoc", "noncommutative", "submitted"],
      ["demo-theorist", "dcs", "draft"],
      ["demo-postdoc", "brans-dicke", "resubmitted"],
    ]);
    const app = buildTestApp(tdb);
    const editor = await bearerFor(tdb.db, "demo-editor");
    const returned = rows[1] as { id: number };
    const thread = await request(app).get(`/api/v1/submissions/${returned.id}/comments`).set("Authorization", `Bearer ${editor}`);
    expect(thread.status).toBe(200);
    expect(thread.body.comments.map((c: { kind: string; author: { login: string } }) => [c.kind, c.author.login])).toEqual([
      ["returned", "demo-admin"],
      ["comment", "demo-phenomenologist"],
    ]);
    const draft = await request(app).get(`/api/v1/submissions/${(rows[3] as { id: number }).id}`).set("Authorization", `Bearer ${await bearerFor(tdb.db, "demo-theorist")}`);
    // The draft appends one condition to the accepted dCS mapping's list.
    const accepted = theoryBySlug("dcs")!.mappings[0]!.validity!.length;
    expect(draft.body.diff.added.map((d: { path: string }) => d.path)).toEqual([`mappings.0.validity.${accepted}`]);
    // The resubmission shows what changed since the returned version 1: the reworded assumption.
    const resubmitted = await request(app).get(`/api/v1/submissions/${(rows[4] as { id: number }).id}`).set("Authorization", `Bearer ${editor}`);
    const bdAssumptions = theoryBySlug("brans-dicke")!.assumptions!.length;
    expect(resubmitted.body.since_returned).toMatchObject({ version: 1, returned_by: { login: "demo-admin" } });
    expect(resubmitted.body.since_returned.diff.changed.map((d: { path: string }) => d.path)).toEqual([`assumptions.${bdAssumptions}`]);
    expect(resubmitted.body.diff.added.map((d: { path: string }) => d.path)).toEqual([`assumptions.${bdAssumptions}`]);
    // Every event happened in the past, in order.
    const events = await tdb.db("submission_events").orderBy("id").pluck("at");
    expect(events.every((at: Date, i: number) => i === 0 || at.getTime() >= (events[i - 1] as Date).getTime())).toBe(true);
    expect((events.at(-1) as Date).getTime()).toBeLessThan(Date.now());
    // The editors were told about the submissions; the returned author about the decision.
    const topics = await tdb.db("mail_queue").orderBy("id").pluck("topic");
    expect(topics.filter((t: string) => t === "submission.decided")).toHaveLength(2);
    expect(topics.filter((t: string) => t === "submission.submitted").length).toBeGreaterThanOrEqual(3);
    // The resubmission's e-mail to the editors names the returned version and where the changes are shown.
    const resent = await tdb.db("mail_queue").where({ topic: "submission.submitted" }).where("subject", "like", "%resubmitted%").pluck("text_body");
    expect(resent.length).toBeGreaterThan(0);
    for (const text of resent) expect(text).toContain("It was returned at version 1. The review page shows what changed since that version beside the changes against the published revision");
  });

  it("when seeded twice, then the second run changes nothing", async () => {
    const before = await tdb.db("submissions").count<{ count: string }[]>("id as count");
    expect(await seedDemo(tdb.db, [accountsSeed, catalogueSeed, demoScenarioSeed])).toBe("already-seeded");
    expect(await tdb.db("submissions").count<{ count: string }[]>("id as count")).toEqual(before);
  });
});
