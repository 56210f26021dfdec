import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { revisionDetailSchema, submissionDetailSchema } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { toyEntry } from "./catalogue-fixtures.ts";

/**
 * Review integrity: whoever saves a version of a submission is one of its authors from that version
 * on; acceptance needs an editor who wrote no version; the published revision lists every author.
 */
let tdb: TestDatabase;
let app: DragomanApp;
const token: Record<string, string> = {};
const ids: Record<string, number> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
  for (const [login, roles] of [
    ["i-theorist", ["contributor"]],
    ["i-editor-a", ["editor"]],
    ["i-editor-b", ["editor"]],
  ] as const) {
    ids[login] = await ensureUser(tdb.db, { login, name: login.toUpperCase(), roles: [...roles] });
    token[login] = await bearerFor(tdb.db, login);
  }
});
afterAll(async () => {
  await tdb.drop();
});

const auth = (login: string) => ({ Authorization: `Bearer ${token[login]}` });
const act = (login: string, id: number, action: string, body?: object) => request(app).post(`/api/v1/submissions/${id}/${action}`).set(auth(login)).send(body ?? {});

/** A toy entry written by i-theorist, submitted, in review by i-editor-a, then edited by i-editor-a (version 2). */
async function editedInReview(slug: string): Promise<number> {
  const created = await request(app).post("/api/v1/submissions").set(auth("i-theorist")).send({ theory: toyEntry({ slug }) });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const id = created.body.id as number;
  expect((await act("i-theorist", id, "submit")).status).toBe(200);
  expect((await act("i-editor-a", id, "start-review")).status).toBe(200);
  const fixed = toyEntry({ slug, summary: "A test entry: scalar dipole radiation, with a typo fixed by the editor." });
  const saved = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("i-editor-a")).send({ version: 1, theory: fixed });
  expect(saved.status, JSON.stringify(saved.body)).toBe(200);
  expect(saved.body.version).toBe(2);
  return id;
}

describe("who may accept an edited submission", () => {
  it("when an editor edited a version, then the detail lists both authors and that editor's accept is refused with 403 naming the version", async () => {
    const id = await editedInReview("toy-integrity-a");
    const detail = submissionDetailSchema.parse((await request(app).get(`/api/v1/submissions/${id}`).set(auth("i-editor-b"))).body);
    expect(detail.authors.map((a) => a.login)).toEqual(["i-theorist", "i-editor-a"]);

    const refused = await act("i-editor-a", id, "decision", { decision: "accept" });
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe(
      `You edited submission #${id} (you wrote version 2), so you are one of its authors; an editor who wrote no version of it must accept it.`,
    );
    expect(refused.body.error.details).toEqual({ reason: "edited_by_you", versions: [2] });
    // Nothing happened: still in review, nothing published.
    expect((await tdb.db("submissions").where({ id }).first<{ status: string }>("status")).status).toBe("in_review");
    expect(await tdb.db("theories").where({ slug: "toy-integrity-a" }).first()).toBeUndefined();
  });

  it("when another editor accepts, then the revision lists every author of the accepted version", async () => {
    const id = await editedInReview("toy-integrity-b");
    const accepted = await act("i-editor-b", id, "decision", { decision: "accept" });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    expect(accepted.body).toMatchObject({ status: "accepted", revision: 1 });

    const revision = revisionDetailSchema.parse((await request(app).get("/api/v1/theories/toy-integrity-b/revisions/1")).body);
    expect(revision.authors).toEqual([
      { id: ids["i-theorist"], login: "i-theorist", name: "I-THEORIST" },
      { id: ids["i-editor-a"], login: "i-editor-a", name: "I-EDITOR-A" },
    ]);
    expect(revision.author?.login).toBe("i-theorist");
    expect(revision.accepted_by?.login).toBe("i-editor-b");
    const list = await request(app).get("/api/v1/theories/toy-integrity-b/revisions");
    expect(list.body.revisions[0].authors.map((a: { login: string }) => a.login)).toEqual(["i-theorist", "i-editor-a"]);
  });

  it("when the editor who edited only returns it, then that is allowed (returning publishes nothing)", async () => {
    const id = await editedInReview("toy-integrity-c");
    const returned = await act("i-editor-a", id, "decision", { decision: "return", comment: "Please check my fix." });
    expect(returned.status).toBe(200);
    expect(returned.body.status).toBe("returned");
  });

  it("when no editor edited, then the reviewing editor may accept and the revision lists the contributor alone", async () => {
    const created = await request(app).post("/api/v1/submissions").set(auth("i-theorist")).send({ theory: toyEntry({ slug: "toy-integrity-d" }) });
    const id = created.body.id as number;
    await act("i-theorist", id, "submit");
    await act("i-editor-a", id, "start-review");
    expect((await act("i-editor-a", id, "decision", { decision: "accept" })).status).toBe(200);
    const revision = await request(app).get("/api/v1/theories/toy-integrity-d/revisions/1");
    expect(revision.body.authors.map((a: { login: string }) => a.login)).toEqual(["i-theorist"]);
  });
});
