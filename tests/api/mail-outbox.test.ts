import request from "supertest";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { startSmtpSink, type SmtpSink } from "../../fakes/smtp.ts";
import type { DragomanApp } from "../../server/app.ts";
import { ConfigError, parseConfig } from "../../server/config.ts";
import { retryDelayMs } from "../../server/mail/dispatcher.ts";
import type { Mailer, MailMessage } from "../../server/mail/mailer.ts";
import { listMailQueue } from "../../server/mail/queue.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, truncateAll, type TestDatabase } from "../helpers/db.ts";
import { toyEntry } from "./catalogue-fixtures.ts";

let tdb: TestDatabase;
let sink: SmtpSink | undefined;
const tokens: Record<string, string> = {};
const apps: DragomanApp[] = [];

const people = [
  { login: "m-author", name: "Petra Quist", roles: ["contributor"], email: "petra.quist@mail.test" },
  { login: "m-editor", name: "Oskar Lind", roles: ["editor"], email: "oskar.lind@mail.test" },
  { login: "m-editor2", name: "Hana Brook", roles: ["editor"], email: "hana.brook@mail.test" },
  { login: "m-silent-editor", name: "No Address", roles: ["editor"], email: null },
] as const;

async function addPeople(): Promise<void> {
  for (const p of people) {
    await ensureUser(tdb.db, { login: p.login, name: p.name, roles: [...p.roles] });
    await tdb.db("users").where({ login: p.login }).update({ email: p.email });
    tokens[p.login] = await bearerFor(tdb.db, p.login);
  }
}

function appWith(env: Record<string, string>, extra: { mailer?: Mailer } = {}): DragomanApp {
  const app = buildTestApp(tdb, { MAIL_SWEEP_MS: "600000", ...env }, extra);
  apps.push(app);
  return app;
}

const as = (login: string) => ({ Authorization: `Bearer ${tokens[login]}` });

async function submittedDraft(app: DragomanApp, slug: string): Promise<number> {
  const created = await request(app).post("/api/v1/submissions").set(as("m-author")).send({ theory: toyEntry({ slug, name: `Entry ${slug}` }) });
  expect(created.status).toBe(201);
  const submitted = await request(app).post(`/api/v1/submissions/${created.body.id}/submit`).set(as("m-author"));
  expect(submitted.status).toBe(200);
  return created.body.id as number;
}

beforeAll(async () => {
  tdb = await createTestDatabase();
});
afterEach(async () => {
  for (const a of apps.splice(0)) a.locals.mailOutbox.stop();
  if (sink) await sink.close();
  sink = undefined;
  await truncateAll(tdb.db);
});
afterAll(async () => {
  await tdb.drop();
});

describe("e-mail of the review process, through the local SMTP sink", () => {
  it("when a contributor submits, then every editor with an address gets one message naming the submission, with a review link", async () => {
    await addPeople();
    sink = await startSmtpSink({ db: tdb.db });
    const app = appWith(sink.env);
    const id = await submittedDraft(app, "mail-submit");
    await app.locals.mailOutbox.drain();

    const res = await request(app).get("/api/v1/dev/outbox");
    expect(res.status).toBe(200);
    const messages = res.body.messages as { to: string; subject: string; text: string; date: string }[];
    expect(messages.map((m) => m.to).sort()).toEqual(["hana.brook@mail.test", "oskar.lind@mail.test"]);
    for (const m of messages) {
      expect(m.subject).toBe(`[Dragoman] Submission #${id} submitted: Entry mail-submit`);
      expect(m.text).toContain("Petra Quist (m-author) has submitted a new entry \"Entry mail-submit\" (mail-submit)");
      expect(m.text).toContain(`/review/${id}`);
      expect(new Date(m.date).getTime()).not.toBeNaN();
    }
    const queue = await listMailQueue(tdb.db, { topic: "submission.submitted" });
    expect(queue.map((q) => q.status)).toEqual(["sent", "sent"]);
  });

  it("when an editor returns or accepts, then the author gets the decision with the editor's comment, newest first in the outbox", async () => {
    await addPeople();
    sink = await startSmtpSink({ db: tdb.db });
    const app = appWith(sink.env);
    const returnedId = await submittedDraft(app, "mail-returned");
    await request(app).post(`/api/v1/submissions/${returnedId}/start-review`).set(as("m-editor"));
    const ret = await request(app).post(`/api/v1/submissions/${returnedId}/decision`).set(as("m-editor")).send({ decision: "return", comment: "Please state the validity threshold's source.\nSecond line." });
    expect(ret.status).toBe(200);
    await app.locals.mailOutbox.drain();
    const acceptedId = await submittedDraft(app, "mail-accepted");
    await request(app).post(`/api/v1/submissions/${acceptedId}/start-review`).set(as("m-editor2"));
    expect((await request(app).post(`/api/v1/submissions/${acceptedId}/decision`).set(as("m-editor2")).send({ decision: "accept", comment: "Well done." })).status).toBe(200);
    await app.locals.mailOutbox.drain();

    const messages = (await request(app).get("/api/v1/dev/outbox")).body.messages as { to: string; subject: string; text: string; date: string }[];
    const toAuthor = messages.filter((m) => m.to === "petra.quist@mail.test");
    expect(toAuthor.map((m) => m.subject)).toEqual([
      `[Dragoman] Submission #${acceptedId} accepted: Entry mail-accepted`,
      `[Dragoman] Submission #${returnedId} returned: Entry mail-returned`,
    ]);
    expect(toAuthor[1]?.text).toContain("Oskar Lind returned your submission");
    expect(toAuthor[1]?.text).toContain("  Please state the validity threshold's source.\n  Second line.");
    expect(toAuthor[1]?.text).toContain(`/submit/${returnedId}`);
    expect(toAuthor[0]?.text).toContain("published as revision 1 of mail-accepted");
    expect(toAuthor[0]?.text).toContain("Well done.");
    const dates = messages.map((m) => Date.parse(m.date));
    expect([...dates].sort((a, b) => b - a)).toEqual(dates);
  });

  it("when the SMTP sink is down, then the submission is still saved with its mail pending; when it is back, the retry sends it", async () => {
    await addPeople();
    await tdb.db("users").whereIn("login", ["m-editor2"]).update({ email: null });
    const probe = await startSmtpSink({ db: tdb.db });
    const port = probe.port;
    await probe.close();
    const app = appWith({ ...probe.env, MAIL_RETRY_BASE_MS: "50" });

    const id = await submittedDraft(app, "mail-down");
    expect((await tdb.db("submissions").where({ id }).first()).status).toBe("submitted");
    await app.locals.mailOutbox.drain();
    const [pending] = await listMailQueue(tdb.db);
    expect(pending).toMatchObject({ to: "oskar.lind@mail.test", status: "pending", attempts: 1 });
    expect(pending?.last_error).toMatch(/ECONNREFUSED|connect/i);

    sink = await startSmtpSink({ db: tdb.db, port });
    // No kick from the test: the dispatcher's own backoff timer retries.
    let [sent] = await listMailQueue(tdb.db);
    for (let i = 0; i < 100 && sent?.status !== "sent"; i++) {
      await new Promise((r) => setTimeout(r, 50));
      [sent] = await listMailQueue(tdb.db);
    }
    expect(sent).toMatchObject({ status: "sent", last_error: null });
    expect(sent?.attempts).toBeGreaterThanOrEqual(2);
    const outbox = (await request(app).get("/api/v1/dev/outbox")).body.messages;
    expect(outbox).toEqual([expect.objectContaining({ to: "oskar.lind@mail.test", subject: `[Dragoman] Submission #${id} submitted: Entry mail-down` })]);
  });

  it("when an injected mailer keeps failing, then it is retried with growing delays and marked failed after MAIL_MAX_ATTEMPTS", async () => {
    await addPeople();
    const attempts: MailMessage[] = [];
    const broken: Mailer = {
      send: async (m) => {
        attempts.push(m);
        throw new Error("relay said no");
      },
      close: () => undefined,
    };
    const app = appWith({ MAIL_RETRY_BASE_MS: "20", MAIL_MAX_ATTEMPTS: "3", DEV_OUTBOX: "true" }, { mailer: broken });
    await tdb.db("users").where({ login: "m-editor2" }).update({ email: null });
    await submittedDraft(app, "mail-broken");
    for (let i = 0; i < 40; i++) {
      const [row] = await listMailQueue(tdb.db);
      if (row?.status === "failed") break;
      await new Promise((r) => setTimeout(r, 25));
      await app.locals.mailOutbox.drain();
    }
    const [row] = await listMailQueue(tdb.db);
    expect(row).toMatchObject({ status: "failed", attempts: 3, last_error: "relay said no" });
    expect(attempts).toHaveLength(3);
    expect(attempts[0]?.to).toBe("oskar.lind@mail.test");
    // Backoff doubles from the base and is capped (common practice for retrying a relay).
    expect([1, 2, 3, 10].map((n) => retryDelayMs(n, 1000, 5000))).toEqual([1000, 2000, 4000, 5000]);
  });

  it("when two app processes share the outbox, then each message is sent once", async () => {
    await addPeople();
    const sent: string[] = [];
    const recording: Mailer = { send: async (m) => void sent.push(m.to), close: () => undefined };
    const first = appWith({}, { mailer: recording });
    const second = appWith({}, { mailer: recording });
    await submittedDraft(first, "mail-shared");
    await Promise.all([first.locals.mailOutbox.drain(), second.locals.mailOutbox.drain(), first.locals.mailOutbox.drain()]);
    expect(sent.sort()).toEqual(["hana.brook@mail.test", "oskar.lind@mail.test"]);
  });
});

describe("GET /api/v1/dev/outbox", () => {
  it("when the mail sink is not in use (DEV_OUTBOX false), then 403 and no messages", async () => {
    const app = appWith({ DEV_OUTBOX: "false" });
    const res = await request(app).get("/api/v1/dev/outbox");
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("forbidden");
  });

  it("when the configuration says production, then DEV_OUTBOX=true is refused at start", () => {
    const env = { NODE_ENV: "production", DATABASE_URL: tdb.url, SESSION_SECRET: "x".repeat(40), GITHUB_CLIENT_SECRET: "s", DEV_OUTBOX: "true" };
    expect(() => parseConfig(env)).toThrow(ConfigError);
    expect(() => parseConfig(env)).toThrow(/DEV_OUTBOX must be false in production/);
  });
});
