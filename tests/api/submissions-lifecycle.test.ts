import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { submissionDetailSchema, type SubmissionStatus, type TheoryEntryInput } from "../../common/catalogue.ts";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { dimensionErrorEntry, seedCatalogue, toyEntry } from "./catalogue-fixtures.ts";

let tdb: TestDatabase;
let app: DragomanApp;
const token: Record<string, string> = {};

beforeAll(async () => {
  tdb = await createTestDatabase();
  await seedCatalogue(tdb.db);
  app = buildTestApp(tdb);
  const people: [string, ("contributor" | "editor" | "analyst")[]][] = [
    ["t-theorist", ["contributor"]],
    ["t-other", ["contributor"]],
    ["t-editor", ["editor"]],
    ["t-editor2", ["editor"]],
    ["t-analyst", ["analyst"]],
  ];
  for (const [login, roles] of people) {
    await ensureUser(tdb.db, { login, roles });
    token[login] = await bearerFor(tdb.db, login);
  }
});
afterAll(async () => {
  await tdb.drop();
});

const auth = (login: string) => ({ Authorization: `Bearer ${token[login]}` });
const create = (login: string, body: unknown) => request(app).post("/api/v1/submissions").set(auth(login)).send(body as object);
const act = (login: string, id: number, action: string, body?: object) => request(app).post(`/api/v1/submissions/${id}/${action}`).set(auth(login)).send(body ?? {});

async function draft(login = "t-theorist", entry: TheoryEntryInput = toyEntry({ slug: `toy-${Math.random().toString(36).slice(2, 8)}` }), target?: string): Promise<number> {
  const res = await create(login, { theory: entry, ...(target ? { target_slug: target } : {}) });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as number;
}

async function statusOf(id: number): Promise<SubmissionStatus> {
  return (await tdb.db("submissions").where({ id }).first<{ status: SubmissionStatus }>("status")).status;
}

describe("POST /api/v1/submissions", () => {
  it("when a contributor sends a valid entry, then 201 draft version 1 with passing checks, stored as sent", async () => {
    const entry = toyEntry({ slug: "toy-create" });
    const res = await create("t-theorist", { theory: entry });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: "draft", version: 1, checks: { ok: true, failures: 0 } });
    expect(res.body.checks.results.map((c: { path: string }) => c.path)).toEqual(expect.arrayContaining(["mappings.0", "mappings.0.validity.0"]));
    const row = await tdb.db("submissions").where({ id: res.body.id }).first();
    expect(row).toMatchObject({ status: "draft", version: 1, checks_ok: true, target_theory_id: null });
    expect(row.entry.mappings[0].expression).toBe(entry.mappings[0]?.expression);
    expect(row.entry.references[0].authors).toEqual(["N. Yunes", "F. Pretorius"]);
    expect(await tdb.db("submission_events").where({ submission_id: res.body.id }).pluck("action")).toEqual(["create"]);
  });

  it("when the expression parses but fails a check, then it is still saved as a draft and the failure is reported", async () => {
    const res = await create("t-theorist", { theory: { ...dimensionErrorEntry(), slug: "toy-dim-error" } });
    expect(res.status).toBe(201);
    expect(res.body.checks.ok).toBe(false);
    const failed = res.body.checks.results.filter((c: { ok: boolean }) => !c.ok);
    expect(failed).toEqual([expect.objectContaining({ path: "mappings.0", name: "dimension", severity: "error" })]);
    expect(failed[0].message).toMatch(/dimension/);
    expect((await tdb.db("submissions").where({ id: res.body.id }).first()).checks_ok).toBe(false);
  });

  it("when the shape is wrong, then 400 naming the field path and nothing is stored", async () => {
    const before = await tdb.db("submissions").count<{ count: string }[]>("id as count");
    const noExpr = toyEntry();
    const { expression: _drop, ...mapping } = noExpr.mappings[0] as TheoryEntryInput["mappings"][number];
    const res = await create("t-theorist", { theory: { ...noExpr, mappings: [mapping] } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(["theory.mappings.0.expression"]);
    expect(res.body.error.message).toContain("theory.mappings.0.expression");
    const noB = await create("t-theorist", { theory: toyEntry({ mappings: [{ kind: "inspiral_phase", pn_order: -1, expression: "zeta" }] }) });
    expect(noB.status).toBe(400);
    expect(noB.body.error.fields).toHaveProperty(["theory.mappings.0.b"]);
    const badRef = await create("t-theorist", { theory: toyEntry({ references: [{ arxiv: "arXiv:0909.3328", authors: ["A"], title: "T", year: 2009 }] }) });
    expect(badRef.status).toBe(400);
    expect(badRef.body.error.fields).toHaveProperty(["theory.references.0.arxiv"]);
    const badDoi = await create("t-theorist", { theory: toyEntry({ references: [{ doi: "https://doi.org/10.1/x", authors: ["A"], title: "T", year: 2009 }] }) });
    expect(badDoi.status).toBe(400);
    expect(badDoi.body.error.fields).toHaveProperty(["theory.references.0.doi"]);
    // Several people typed into one author field with commas would be stored as one author: refused, naming the field.
    const commaAuthors = await create("t-theorist", { theory: toyEntry({ references: [{ arxiv: "0909.3328", authors: "N. Yunes, F. Pretorius", title: "T", year: 2009 }] }) });
    expect(commaAuthors.status).toBe(400);
    expect(commaAuthors.body.error.fields["theory.references.0.authors"]).toMatch(/several authors separated by commas/);
    const dangling = await create("t-theorist", { theory: toyEntry({ mappings: [{ ...(toyEntry().mappings[0] as object), references: ["nobody-2020"] } as TheoryEntryInput["mappings"][number]] }) });
    expect(dangling.status).toBe(400);
    expect(dangling.body.error.fields).toHaveProperty(["theory.mappings.0.references.0"]);
    const after = await tdb.db("submissions").count<{ count: string }[]>("id as count");
    expect(after[0]?.count).toBe(before[0]?.count);
  });

  it("when the guard rejects an expression (forbidden syntax, unknown function, too long), then 400 with its path", async () => {
    const cases: [string, (e: TheoryEntryInput) => TheoryEntryInput, string][] = [
      ["assignment", (e) => ({ ...e, mappings: [{ ...(e.mappings[0] as object), expression: "f(x):=x^2" } as TheoryEntryInput["mappings"][number]] }), "theory.mappings.0.expression"],
      ["property access", (e) => ({ ...e, mappings: [{ ...(e.mappings[0] as object), expression: "this.constructor" } as TheoryEntryInput["mappings"][number]] }), "theory.mappings.0.expression"],
      ["too long", (e) => ({ ...e, mappings: [{ ...(e.mappings[0] as object), expression: Array(700).fill("zeta").join("+") } as TheoryEntryInput["mappings"][number]] }), "theory.mappings.0.expression"],
      ["in a validity condition", (e) => ({ ...e, mappings: [{ ...(e.mappings[0] as object), validity: [{ expression: "eval(1)", max: 1, label: "x" }] } as TheoryEntryInput["mappings"][number]] }), "theory.mappings.0.validity.0.expression"],
      ["in a definition", (e) => ({ ...e, definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4;" }] }), "theory.definitions.0.expression"],
    ];
    for (const [what, edit, path] of cases) {
      const res = await create("t-theorist", { theory: edit(toyEntry({ slug: "toy-guard" })) });
      expect(res.status, what).toBe(400);
      expect(Object.keys(res.body.error.fields), what).toContain(path);
    }
    expect(await tdb.db("submissions").where("entry", "@>", JSON.stringify({ slug: "toy-guard" })).count<{ count: string }[]>("id as count")).toEqual([{ count: "0" }]);
  });

  it("when target_slug is unknown, or the entry renames its target, or a new entry reuses a slug, then 400 / 409 naming the field", async () => {
    const unknown = await create("t-theorist", { target_slug: "no-such", theory: toyEntry({ slug: "no-such" }) });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toHaveProperty("target_slug");
    const renamed = await create("t-theorist", { target_slug: "edgb", theory: toyEntry({ slug: "edgb-2" }) });
    expect(renamed.status).toBe(400);
    expect(renamed.body.error.fields).toHaveProperty(["theory.slug"]);
    const reused = await create("t-theorist", { theory: toyEntry({ slug: "edgb" }) });
    expect(reused.status).toBe(409);
    expect(reused.body.error.message).toContain("theory.slug");
  });

  it("when anonymous or an analyst calls, then 401 and 403", async () => {
    expect((await request(app).post("/api/v1/submissions").send({ theory: toyEntry() })).status).toBe(401);
    const analyst = await create("t-analyst", { theory: toyEntry() });
    expect(analyst.status).toBe(403);
    expect(analyst.body.error.code).toBe("forbidden");
  });
});

describe("GET /api/v1/submissions and /:id", () => {
  it("when a contributor lists, then only their own; an editor sees everyone's unless mine=1", async () => {
    const mine = await draft("t-other");
    const theirs = await request(app).get("/api/v1/submissions").set(auth("t-other"));
    expect(theirs.status).toBe(200);
    expect(theirs.body.submissions.length).toBeGreaterThan(0);
    expect(theirs.body.submissions.every((s: { author: { login: string } }) => s.author.login === "t-other")).toBe(true);
    const editorAll = await request(app).get("/api/v1/submissions").set(auth("t-editor"));
    expect(editorAll.body.submissions.map((s: { id: number }) => s.id)).toContain(mine);
    const editorMine = await request(app).get("/api/v1/submissions").query({ mine: 1 }).set(auth("t-editor"));
    expect(editorMine.body.submissions).toEqual([]);
    const drafts = await request(app).get("/api/v1/submissions").query({ status: "draft,in_review" }).set(auth("t-editor"));
    expect(drafts.body.submissions.length).toBeGreaterThan(0);
    expect(drafts.body.submissions.every((s: { status: string }) => ["draft", "in_review"].includes(s.status))).toBe(true);
    const bad = await request(app).get("/api/v1/submissions").query({ status: "pending" }).set(auth("t-editor"));
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)[0]).toMatch(/^status/);
  });

  it("when the author or an editor reads one, then the entry and checks; another contributor gets 403; unknown 404", async () => {
    const id = await draft("t-theorist");
    const own = await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-theorist"));
    expect(own.status).toBe(200);
    const body = submissionDetailSchema.parse(own.body);
    expect(body).toMatchObject({ id, status: "draft", version: 1, target_slug: null, diff: null, target_revision: null });
    expect(body.checks.ok).toBe(true);
    expect((await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-editor"))).status).toBe(200);
    const other = await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-other"));
    expect(other.status).toBe(403);
    expect((await request(app).get("/api/v1/submissions/999999").set(auth("t-editor"))).status).toBe(404);
    const bad = await request(app).get("/api/v1/submissions/abc").set(auth("t-editor"));
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("id");
  });
});

describe("PATCH /api/v1/submissions/:id", () => {
  it("when the author saves from the current version, then 200 with the next version and the new checks", async () => {
    const id = await draft();
    const fixed = toyEntry({ slug: (await tdb.db("submissions").where({ id }).first()).entry.slug, summary: "Second version." });
    const res = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 1, theory: fixed });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id, status: "draft", version: 2, checks: { ok: true } });
    const row = await tdb.db("submissions").where({ id }).first();
    expect(row.version).toBe(2);
    expect(row.entry.summary).toBe("Second version.");
  });

  it("when the version is stale, then 409 naming the newer version, and the stored entry is untouched", async () => {
    const id = await draft();
    const slug = (await tdb.db("submissions").where({ id }).first()).entry.slug;
    await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 1, theory: toyEntry({ slug, summary: "kept" }) });
    const stale = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 1, theory: toyEntry({ slug, summary: "lost?" }) });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toMatchObject({ current_version: 2, your_version: 1 });
    expect(stale.body.error.message).toContain("version 2");
    expect((await tdb.db("submissions").where({ id }).first()).entry.summary).toBe("kept");
  });

  it("when someone else's, or in a state the caller may not edit, then 403 or 409 naming the state", async () => {
    const id = await draft();
    const slug = (await tdb.db("submissions").where({ id }).first()).entry.slug;
    const other = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-other")).send({ version: 1, theory: toyEntry({ slug }) });
    expect(other.status).toBe(403);
    const editorOnDraft = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-editor")).send({ version: 1, theory: toyEntry({ slug }) });
    expect(editorOnDraft.status).toBe(409);
    expect(editorOnDraft.body.error.details).toMatchObject({ current_status: "draft", attempted_action: "save" });
    await act("t-theorist", id, "submit");
    const authorWhileSubmitted = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 1, theory: toyEntry({ slug }) });
    expect(authorWhileSubmitted.status).toBe(409);
    expect(authorWhileSubmitted.body.error.message).toContain("submitted");
    const editorWhileSubmitted = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-editor")).send({ version: 1, theory: toyEntry({ slug, summary: "edited by the editor" }) });
    expect(editorWhileSubmitted.status).toBe(200);
    expect(editorWhileSubmitted.body.version).toBe(2);
  });
});

describe("the review process", () => {
  it("when a new entry goes draft -> submitted -> in_review -> accepted, then revision 1 of the theory is published", async () => {
    const id = await draft("t-theorist", toyEntry({ slug: "toy-published" }));
    expect((await act("t-theorist", id, "submit")).body).toEqual({ id, status: "submitted", version: 1 });
    expect((await act("t-editor", id, "start-review")).body).toEqual({ id, status: "in_review", version: 1 });
    const accepted = await act("t-editor", id, "decision", { decision: "accept", comment: "Clear and checked." });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toEqual({ id, status: "accepted", version: 1, revision: 1 });
    const theory = await request(app).get("/api/v1/theories/toy-published");
    expect(theory.status).toBe(200);
    expect(theory.body.revision.number).toBe(1);
    const revs = await request(app).get("/api/v1/theories/toy-published/revisions");
    expect(revs.body.revisions[0]).toMatchObject({ number: 1, submission_id: id, author: { login: "t-theorist" }, accepted_by: { login: "t-editor" } });
    expect(await tdb.db("submission_events").where({ submission_id: id }).orderBy("id").pluck("action")).toEqual(["create", "submit", "start_review", "accept"]);
    const row = await tdb.db("submissions").where({ id }).first();
    expect(row).toMatchObject({ status: "accepted", published_revision: 1 });
  });

  it("when a change to an accepted theory is accepted, then revision 2 is readable with a diff against revision 1, and revision 1 stays readable", async () => {
    const current = (await request(app).get("/api/v1/theories/edgb/revisions/1")).body.entry as TheoryEntryInput;
    const changed = { ...current, summary: `${current.summary} Revised wording.`, assumptions: [...(current.assumptions ?? []), "a new assumption"] };
    const id = await draft("t-theorist", changed, "edgb");
    const detail = await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-editor"));
    expect(detail.body).toMatchObject({ target_slug: "edgb", target_revision: 1 });
    expect(detail.body.diff.changed).toEqual([{ path: "summary", before: current.summary, after: changed.summary }]);
    expect(detail.body.diff.added).toEqual([{ path: `assumptions.${current.assumptions?.length}`, after: "a new assumption" }]);
    await act("t-theorist", id, "submit");
    await act("t-editor2", id, "start-review");
    expect((await act("t-editor2", id, "decision", { decision: "accept" })).body.revision).toBe(2);

    const list = await request(app).get("/api/v1/theories/edgb/revisions");
    expect(list.body.revisions.map((r: { number: number }) => r.number)).toEqual([2, 1]);
    expect(list.body.revisions[0].change_count).toBe(2);
    const two = await request(app).get("/api/v1/theories/edgb/revisions/2");
    expect(two.body.diff).toEqual({ added: [{ path: `assumptions.${current.assumptions?.length}`, after: "a new assumption" }], removed: [], changed: [{ path: "summary", before: current.summary, after: changed.summary }] });
    expect((await request(app).get("/api/v1/theories/edgb/revisions/1")).body.entry.summary).toBe(current.summary);
    const theory = await request(app).get("/api/v1/theories/edgb");
    expect(theory.body).toMatchObject({ summary: changed.summary, revision: { number: 2 } });
    // The normalised rows were rebuilt, not duplicated.
    const tid = (await tdb.db("theories").where({ slug: "edgb" }).first()).id;
    expect(await tdb.db("mappings").where({ theory_id: tid }).count<{ count: string }[]>("id as count")).toEqual([{ count: "1" }]);
    expect(await tdb.db("coupling_conventions as cc").join("couplings as c", "c.id", "cc.coupling_id").where("c.theory_id", tid).count<{ count: string }[]>("cc.id as count")).toEqual([{ count: "3" }]);
  });

  it("when returned with a comment, then the author sees it, resubmits (resubmitted), and can be reviewed again", async () => {
    const id = await draft();
    await act("t-theorist", id, "submit");
    await act("t-editor", id, "start-review");
    const noComment = await act("t-editor", id, "decision", { decision: "return" });
    expect(noComment.status).toBe(400);
    expect(noComment.body.error.fields).toHaveProperty("comment");
    const returned = await act("t-editor", id, "decision", { decision: "return", comment: "Please cite the flux derivation." });
    expect(returned.body).toMatchObject({ status: "returned", revision: null });
    const thread = await request(app).get(`/api/v1/submissions/${id}/comments`).set(auth("t-theorist"));
    expect(thread.status).toBe(200);
    expect(thread.body.comments).toEqual([expect.objectContaining({ kind: "returned", body: "Please cite the flux derivation.", author: expect.objectContaining({ login: "t-editor" }) })]);
    const slug = (await tdb.db("submissions").where({ id }).first()).entry.slug;
    const revised = await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 1, theory: toyEntry({ slug, summary: "Now with the derivation." }) });
    expect(revised.status).toBe(200);
    expect((await act("t-theorist", id, "submit")).body.status).toBe("resubmitted");
    expect((await act("t-editor", id, "start-review")).body.status).toBe("in_review");
  });

  it("when a returned change is revised and resubmitted, then the editor reads the diff since the returned version beside the diff against the published revision", async () => {
    const current = (await request(app).get("/api/v1/theories/brans-dicke/revisions/1")).body.entry as TheoryEntryInput;
    const first = { ...current, assumptions: [...(current.assumptions ?? []), "stiff equation of state"] };
    const id = await draft("t-theorist", first, "brans-dicke");
    const neverReturned = await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-editor"));
    expect(neverReturned.body.since_returned).toBeNull();
    // Saved twice before submitting: the returned version is 2, not 1.
    const v2 = { ...first, summary: `${current.summary} Tidied.` };
    expect((await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 1, theory: v2 })).body.version).toBe(2);
    await act("t-theorist", id, "submit");
    await act("t-editor", id, "start-review");
    await act("t-editor", id, "decision", { decision: "return", comment: "State the sensitivity range." });
    const atReturn = await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-theorist"));
    expect(atReturn.body.since_returned).toMatchObject({ version: 2, returned_by: { login: "t-editor" }, diff: { added: [], removed: [], changed: [] } });

    const n = current.assumptions?.length ?? 0;
    const v3 = { ...v2, assumptions: [...(current.assumptions ?? []), "sensitivity 0.1 to 0.3"] };
    expect((await request(app).patch(`/api/v1/submissions/${id}`).set(auth("t-theorist")).send({ version: 2, theory: v3 })).body.version).toBe(3);
    expect((await act("t-theorist", id, "submit")).body.status).toBe("resubmitted");

    const detail = await request(app).get(`/api/v1/submissions/${id}`).set(auth("t-editor2"));
    expect(detail.status).toBe(200);
    expect(submissionDetailSchema.parse(detail.body)).toBeTruthy();
    expect(detail.body.version).toBe(3);
    // Since the returned version 2: only the reworded assumption.
    expect(detail.body.since_returned).toMatchObject({ version: 2, returned_by: { login: "t-editor" } });
    expect(detail.body.since_returned.returned_at).toEqual(expect.any(String));
    expect(detail.body.since_returned.diff).toEqual({ added: [], removed: [], changed: [{ path: `assumptions.${n}`, before: "stiff equation of state", after: "sensitivity 0.1 to 0.3" }] });
    // Against the published revision: the summary and the added assumption.
    expect(detail.body.diff.changed).toEqual([{ path: "summary", before: current.summary, after: v3.summary }]);
    expect(detail.body.diff.added).toEqual([{ path: `assumptions.${n}`, after: "sensitivity 0.1 to 0.3" }]);
    // Every version is kept as it was saved.
    const versions = await tdb.db("submission_versions").where({ submission_id: id }).orderBy("version").select("version", "entry");
    expect(versions.map((v: { version: number; entry: TheoryEntryInput }) => [v.version, v.entry.assumptions?.[n]])).toEqual([
      [1, "stiff equation of state"],
      [2, "stiff equation of state"],
      [3, "sensitivity 0.1 to 0.3"],
    ]);
  });

  it("when the author withdraws a returned submission, then withdrawn, and nothing more can happen to it", async () => {
    const id = await draft();
    await act("t-theorist", id, "submit");
    await act("t-editor", id, "start-review");
    await act("t-editor", id, "decision", { decision: "return", comment: "Needs work." });
    expect((await act("t-other", id, "withdraw")).status).toBe(403);
    expect((await act("t-theorist", id, "withdraw")).body.status).toBe("withdrawn");
    const again = await act("t-theorist", id, "submit");
    expect(again.status).toBe(409);
    expect(again.body.error.details).toMatchObject({ current_status: "withdrawn", attempted_action: "submit" });
  });

  it("when an editor decides on their own submission, then 403 and it stays in review", async () => {
    const id = await draft("t-editor2", toyEntry({ slug: "toy-editor-own" }));
    await act("t-editor2", id, "submit");
    await act("t-editor", id, "start-review");
    const own = await act("t-editor2", id, "decision", { decision: "accept" });
    expect(own.status).toBe(403);
    expect(own.body.error.message).toContain("another editor");
    expect(await statusOf(id)).toBe("in_review");
  });

  it("when a check fails, then accepting answers 409 naming the failed check and mapping, and nothing is published", async () => {
    const id = await draft("t-theorist", { ...dimensionErrorEntry(), slug: "toy-failing" });
    await act("t-theorist", id, "submit");
    await act("t-editor", id, "start-review");
    const res = await act("t-editor", id, "decision", { decision: "accept" });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('check "dimension" failed on mappings.0');
    expect(res.body.error.message).toContain("b = -7");
    expect(res.body.error.details.failed_checks[0]).toMatchObject({ path: "mappings.0", name: "dimension" });
    expect(await statusOf(id)).toBe("in_review");
    expect(await tdb.db("theories").where({ slug: "toy-failing" }).first()).toBeUndefined();
  });

  it("when any action is tried from a state that does not allow it, then 409 naming the state and the action", async () => {
    const allowed: Record<string, SubmissionStatus[]> = {
      submit: ["draft", "returned"],
      "start-review": ["submitted", "resubmitted"],
      accept: ["in_review"],
      return: ["in_review"],
      withdraw: ["draft", "submitted", "resubmitted", "returned"],
    };
    const statuses: SubmissionStatus[] = ["draft", "submitted", "in_review", "accepted", "returned", "resubmitted", "withdrawn"];
    const id = await draft();
    let checked = 0;
    for (const [action, from] of Object.entries(allowed)) {
      for (const status of statuses.filter((s) => !from.includes(s))) {
        await tdb.db("submissions").where({ id }).update({ status });
        const [who, path, body] =
          action === "accept" || action === "return"
            ? ["t-editor", "decision", { decision: action, comment: "c" }]
            : action === "start-review"
              ? ["t-editor", action, {}]
              : ["t-theorist", action, {}];
        const res = await act(who, id, path, body);
        expect(res.status, `${action} from ${status}`).toBe(409);
        expect(res.body.error.details, `${action} from ${status}`).toMatchObject({ current_status: status, attempted_action: action.replace("-", "_") });
        expect(res.body.error.message).toContain(status.replace("_", " "));
        expect(await statusOf(id)).toBe(status);
        checked++;
      }
    }
    // 7 states x 5 actions, minus the 10 allowed (state, action) pairs.
    expect(checked).toBe(25);
  });
});

describe("GET/POST /api/v1/submissions/:id/comments", () => {
  it("when the author and an editor comment, then both are in the thread in order; others are refused", async () => {
    const id = await draft();
    const a = await request(app).post(`/api/v1/submissions/${id}/comments`).set(auth("t-theorist")).send({ body: "Question about the b = -7 term." });
    expect(a.status).toBe(201);
    expect(a.body).toMatchObject({ submission_id: id, kind: "comment", body: "Question about the b = -7 term.", author: { login: "t-theorist" } });
    const e = await request(app).post(`/api/v1/submissions/${id}/comments`).set(auth("t-editor")).send({ body: "Answer." });
    expect(e.status).toBe(201);
    const thread = await request(app).get(`/api/v1/submissions/${id}/comments`).set(auth("t-editor"));
    expect(thread.body.comments.map((c: { body: string }) => c.body)).toEqual(["Question about the b = -7 term.", "Answer."]);
    expect((await request(app).post(`/api/v1/submissions/${id}/comments`).set(auth("t-other")).send({ body: "x" })).status).toBe(403);
    expect((await request(app).get(`/api/v1/submissions/${id}/comments`).set(auth("t-analyst"))).status).toBe(403);
    const empty = await request(app).post(`/api/v1/submissions/${id}/comments`).set(auth("t-theorist")).send({ body: "  " });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty("body");
    expect(await tdb.db("submission_comments").where({ submission_id: id }).count<{ count: string }[]>("id as count")).toEqual([{ count: "2" }]);
  });
});
