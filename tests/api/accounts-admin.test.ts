import request from "supertest";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { ROLE_NAMES } from "../../common/accounts.ts";
import { ROLES } from "../../server/http/identity.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, truncateAll, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
let adminToken: string;
beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
});
beforeEach(async () => {
  await truncateAll(tdb.db);
  await ensureUser(tdb.db, { login: "a-boss", name: "Adele Boss", roles: ["admin"] });
  await ensureUser(tdb.db, { login: "a-member", name: "Mika Member", roles: ["contributor"] });
  adminToken = await bearerFor(tdb.db, "a-boss");
});
afterAll(async () => {
  await tdb.drop();
});

const asAdmin = (r: request.Test) => r.set("Authorization", `Bearer ${adminToken}`);

describe("role names", () => {
  it("when the client's list (common/accounts.ts) is compared with the server's, then they are the same", () => {
    expect([...ROLE_NAMES]).toEqual([...ROLES]);
  });
});

describe("GET /api/v1/admin/users", () => {
  it("when an admin asks, then every user with roles, ordered by login", async () => {
    const res = await asAdmin(request(app).get("/api/v1/admin/users"));
    expect(res.status).toBe(200);
    expect(res.body.users).toEqual([
      { login: "a-boss", name: "Adele Boss", roles: ["admin"], created_at: expect.any(String), last_sign_in_at: null },
      { login: "a-member", name: "Mika Member", roles: ["contributor"], created_at: expect.any(String), last_sign_in_at: null },
    ]);
  });

  it("when an editor asks, then 403 naming the admin role", async () => {
    await ensureUser(tdb.db, { login: "a-editor", roles: ["editor"] });
    const res = await request(app).get("/api/v1/admin/users").set("Authorization", `Bearer ${await bearerFor(tdb.db, "a-editor")}`);
    expect(res.status).toBe(403);
    expect(res.body.error).toEqual({ code: "forbidden", message: "This needs the admin role; you have editor.", details: { required_roles: ["admin"] } });
  });
});

describe("PUT /api/v1/admin/users/:login/roles", () => {
  it("when an admin sets roles, then 200, the row changes and one audit entry records who, when, before and after", async () => {
    const res = await asAdmin(request(app).put("/api/v1/admin/users/a-member/roles")).send({ roles: ["editor", "contributor", "editor"] });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ login: "a-member", roles: ["contributor", "editor"] });
    const row = await tdb.db("users").where({ login: "a-member" }).first();
    expect(row.roles).toEqual(["contributor", "editor"]);

    const audit = await tdb.db("audit_log").select("*");
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actor_login: "a-boss", action: "roles.set", subject: "a-member", before: ["contributor"], after: ["contributor", "editor"] });
    expect(Date.now() - new Date(audit[0].at).getTime()).toBeLessThan(60_000);

    const listed = await asAdmin(request(app).get("/api/v1/admin/audit"));
    expect(listed.status).toBe(200);
    expect(listed.body.entries).toEqual([
      { id: expect.any(Number), at: expect.any(String), actor: "a-boss", action: "roles.set", subject: "a-member", before: ["contributor"], after: ["contributor", "editor"] },
    ]);
  });

  it("when the roles are unchanged, then 200 and no audit entry", async () => {
    const res = await asAdmin(request(app).put("/api/v1/admin/users/a-member/roles")).send({ roles: ["contributor"] });
    expect(res.status).toBe(200);
    expect(await tdb.db("audit_log").count<{ n: string }[]>("* as n")).toEqual([{ n: "0" }]);
  });

  it("when a role name is unknown, then 400 naming the offending entry and nothing changes", async () => {
    const res = await asAdmin(request(app).put("/api/v1/admin/users/a-member/roles")).send({ roles: ["editor", "superuser"] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ "roles.1": "must be one of contributor, analyst, editor, admin" });
    expect((await tdb.db("users").where({ login: "a-member" }).first()).roles).toEqual(["contributor"]);
  });

  it("when roles is missing, then 400 naming roles", async () => {
    const res = await asAdmin(request(app).put("/api/v1/admin/users/a-member/roles")).send({});
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["roles"]);
  });

  it("when the login does not exist, then 404", async () => {
    const res = await asAdmin(request(app).put("/api/v1/admin/users/nobody/roles")).send({ roles: [] });
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({ code: "not_found", message: "No user with login nobody." });
  });

  it("when the last admin removes their own admin role, then 409 and they stay admin", async () => {
    const res = await asAdmin(request(app).put("/api/v1/admin/users/a-boss/roles")).send({ roles: ["editor"] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("conflict");
    expect(res.body.error.message).toMatch(/last admin/);
    expect((await tdb.db("users").where({ login: "a-boss" }).first()).roles).toEqual(["admin"]);
    expect(await tdb.db("audit_log").count<{ n: string }[]>("* as n")).toEqual([{ n: "0" }]);
  });

  it("when another admin exists, then an admin may step down", async () => {
    await asAdmin(request(app).put("/api/v1/admin/users/a-member/roles")).send({ roles: ["admin"] });
    const res = await asAdmin(request(app).put("/api/v1/admin/users/a-boss/roles")).send({ roles: ["editor"] });
    expect(res.status).toBe(200);
    expect(res.body.user.roles).toEqual(["editor"]);
    // Their token now acts with the new roles.
    expect((await asAdmin(request(app).get("/api/v1/admin/users"))).status).toBe(403);
  });

  it("when two admins demote each other at the same moment, then exactly one succeeds", async () => {
    await ensureUser(tdb.db, { login: "a-second", roles: ["admin"] });
    const second = await bearerFor(tdb.db, "a-second");
    const [one, two] = await Promise.all([
      asAdmin(request(app).put("/api/v1/admin/users/a-second/roles")).send({ roles: [] }),
      request(app).put("/api/v1/admin/users/a-boss/roles").set("Authorization", `Bearer ${second}`).send({ roles: [] }),
    ]);
    const statuses = [one.status, two.status].sort();
    // 403 is possible too: the loser may already have been demoted when its request was authorised.
    expect(statuses[0]).toBe(200);
    expect([403, 409]).toContain(statuses[1]);
    const admins = await tdb.db("users").whereRaw("'admin' = any(roles)");
    expect(admins).toHaveLength(1);
  });
});

describe("GET /api/v1/admin/audit", () => {
  it("when filtered by subject with a limit, then only those entries, newest first", async () => {
    for (const roles of [["analyst"], ["analyst", "editor"], []]) {
      await asAdmin(request(app).put("/api/v1/admin/users/a-member/roles")).send({ roles });
    }
    const res = await asAdmin(request(app).get("/api/v1/admin/audit?subject=a-member&limit=2"));
    expect(res.status).toBe(200);
    expect(res.body.entries.map((e: { after: string[] }) => e.after)).toEqual([[], ["analyst", "editor"]]);
  });

  it("when the limit is not a number, then 400 naming limit", async () => {
    const res = await asAdmin(request(app).get("/api/v1/admin/audit?limit=lots"));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["limit"]);
  });
});
