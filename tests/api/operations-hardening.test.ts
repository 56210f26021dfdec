import { Writable } from "node:stream";
import { pino } from "pino";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ConfigError, parseConfig } from "../../server/config.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
beforeAll(async () => {
  tdb = await createTestDatabase();
});
afterAll(async () => {
  await tdb.drop();
});

describe("production configuration", () => {
  const production = { NODE_ENV: "production", DATABASE_URL: "postgres://x@127.0.0.1/db", SESSION_SECRET: "s".repeat(40), PUBLIC_URL: "https://dragoman.example" };

  it("when GITHUB_CLIENT_ID is missing in production, then the start is refused with one sentence naming it", () => {
    const env = { ...production, GITHUB_CLIENT_SECRET: "real-secret" };
    expect(() => parseConfig(env)).toThrow(ConfigError);
    expect(() => parseConfig(env)).toThrow(/^Bad configuration: GITHUB_CLIENT_ID is required in production\. See README\.md/);
  });

  it("when GITHUB_CLIENT_SECRET is missing in production, then it is named (and its value never shown)", () => {
    expect(() => parseConfig({ ...production, GITHUB_CLIENT_ID: "Iv1.real" })).toThrow(/^Bad configuration: GITHUB_CLIENT_SECRET is required in production\./);
  });

  it("when both are set, then production starts with them; outside production the local fake's id is the default", () => {
    expect(parseConfig({ ...production, GITHUB_CLIENT_ID: "Iv1.real", GITHUB_CLIENT_SECRET: "real-secret" }).GITHUB_CLIENT_ID).toBe("Iv1.real");
    expect(parseConfig({ DATABASE_URL: "postgres://x@127.0.0.1/db" }).GITHUB_CLIENT_ID).toBe("dragoman-local");
  });
});

describe("request log", () => {
  it("when a share link is opened (page or API), then its secret is not in the log", async () => {
    const lines: string[] = [];
    const sink = new Writable({
      write(chunk, _enc, cb) {
        lines.push(String(chunk));
        cb();
      },
    });
    const app = buildTestApp(tdb, {}, { logger: pino({ level: "info" }, sink) });
    const secret = "Zq3sharesecretZq3sharesecretZq3sharesecret";
    expect((await request(app).get(`/api/v1/shared/${secret}`)).status).toBe(404);
    await request(app).get(`/api/v1/shared/${secret}/export?format=csv`);
    await request(app).get(`/shared/${secret}`);
    const all = lines.join("");
    expect(lines.length).toBeGreaterThanOrEqual(3);
    expect(all).not.toContain(secret);
    expect(all).toContain("/api/v1/shared/[redacted]/export?format=csv");
    expect(all).toContain('"url":"/shared/[redacted]"');
  });
});
