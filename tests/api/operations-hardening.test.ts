import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { get as httpGet, type IncomingHttpHeaders } from "node:http";
import type { AddressInfo } from "node:net";
import { connect } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { Writable } from "node:stream";
import { brotliDecompressSync, gunzipSync } from "node:zlib";
import { pino } from "pino";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.ts";
import { ConfigError, parseConfig } from "../../server/config.ts";
import { createHttpServer } from "../../server/index.ts";
import { createLogger } from "../../server/logger.ts";
import { precompressDir } from "../../scripts/precompress.ts";
import { buildTestApp, testConfig } from "../helpers/app.ts";
import { signInAgent, startSignInStack } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { seedCatalogue } from "./catalogue-fixtures.ts";

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

describe("sessions", () => {
  const rows = async () => tdb.db("user_sessions").select<{ sid: string; expire: Date }[]>("sid", "expire");

  it("when a visitor browses (pages, catalogue, session and CSRF probes), then no session row and no session cookie are made", async () => {
    await tdb.db("user_sessions").delete();
    const app = buildTestApp(tdb);
    for (const url of ["/", "/catalogue", "/api/health", "/api/v1/session", "/api/v1/csrf", "/api/v1/theories", "/api/v1/theories/none", "/api/v1/openapi.json"]) {
      const res = await request(app).get(url);
      expect(String(res.headers["set-cookie"] ?? ""), url).not.toContain("dragoman.sid");
    }
    expect(await rows()).toEqual([]);
  });

  it("when a sign-in is started and abandoned, then its session lives minutes (SIGNIN_SESSION_MINUTES), not SESSION_TTL_HOURS", async () => {
    await tdb.db("user_sessions").delete();
    const stack = await startSignInStack(tdb);
    try {
      const started = Date.now();
      const res = await request(stack.baseUrl).get("/auth/github?login_hint=demo-reader");
      expect(res.status).toBe(302);
      const [row] = await rows();
      expect(row).toBeDefined();
      const lifetimeMin = (row!.expire.getTime() - started) / 60_000;
      expect(lifetimeMin).toBeGreaterThan(5);
      expect(lifetimeMin).toBeLessThanOrEqual(11);
    } finally {
      await stack.close();
    }
  });

  it("when the sign-in completes, then the regenerated session gets the full SESSION_TTL_HOURS and the pending one is gone", async () => {
    await tdb.db("user_sessions").delete();
    const stack = await startSignInStack(tdb);
    try {
      const started = Date.now();
      await signInAgent(stack.baseUrl, "demo-reader");
      const all = await rows();
      expect(all).toHaveLength(1);
      const hours = (all[0]!.expire.getTime() - started) / 3_600_000;
      expect(hours).toBeGreaterThan(335);
      expect(hours).toBeLessThanOrEqual(336.1);
    } finally {
      await stack.close();
    }
  });
});

describe("HTTP server timeouts", () => {
  it("when a client sends a body slower than REQUEST_TIMEOUT_MS allows, then it gets 408 and the connection is closed", async () => {
    const config = testConfig(tdb.url, { REQUEST_TIMEOUT_MS: "1500", HEADERS_TIMEOUT_MS: "1000" });
    const server = createHttpServer(createApp({ db: tdb.db, config, logger: createLogger(config) }), config);
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
    const port = (server.address() as AddressInfo).port;
    try {
      const answer = await new Promise<string>((resolve, reject) => {
        const socket = connect(port, "127.0.0.1");
        let received = "";
        let drip: NodeJS.Timeout | undefined;
        socket.on("connect", () => {
          socket.write("POST /api/v1/expressions/check HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\nContent-Length: 100000\r\n\r\n{");
          // One byte every 200 ms: the body would take hours to arrive.
          drip = setInterval(() => socket.writable && socket.write(" "), 200);
        });
        socket.on("data", (d) => (received += String(d)));
        socket.on("close", () => {
          clearInterval(drip);
          resolve(received);
        });
        socket.on("error", (err) => {
          clearInterval(drip);
          if (received) resolve(received);
          else reject(err);
        });
      });
      expect(answer).toMatch(/^HTTP\/1\.1 408/);
    } finally {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
    }
  });

  it("when HEADERS_TIMEOUT_MS exceeds REQUEST_TIMEOUT_MS, then the configuration names it", () => {
    expect(() => parseConfig({ DATABASE_URL: "postgres://x@127.0.0.1/db", REQUEST_TIMEOUT_MS: "5000", HEADERS_TIMEOUT_MS: "9000" })).toThrow(
      /HEADERS_TIMEOUT_MS must not exceed REQUEST_TIMEOUT_MS \(5000\)/,
    );
  });
});

describe("compression and client caching", () => {
  let dist: string;
  const bigScript = `export const words = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => `word-${i}`))};\n`;
  beforeAll(() => {
    dist = mkdtempSync(path.join(tmpdir(), "dragoman-dist-"));
    mkdirSync(path.join(dist, "assets"));
    writeFileSync(path.join(dist, "index.html"), `<!doctype html><title>Dragoman test shell</title><script type="module" src="/assets/index-Ab12Cd34.js"></script>`);
    writeFileSync(path.join(dist, "assets", "index-Ab12Cd34.js"), bigScript);
    writeFileSync(path.join(dist, "favicon.svg"), "<svg xmlns='http://www.w3.org/2000/svg'/>");
  });

  it("when a client accepts brotli or only gzip, then API answers and assets come compressed that way", async () => {
    const app = buildTestApp(tdb, { CLIENT_DIST: dist });
    for (const [accept, expected] of [
      ["br, gzip, deflate", "br"],
      ["gzip", "gzip"],
    ] as const) {
      const api = await request(app).get("/api/v1/openapi.json").set("Accept-Encoding", accept);
      expect(api.status).toBe(200);
      expect(api.headers["content-encoding"], `API with ${accept}`).toBe(expected);
      const asset = await request(app).get("/assets/index-Ab12Cd34.js").set("Accept-Encoding", accept);
      expect(asset.status).toBe(200);
      expect(asset.headers["content-encoding"], `asset with ${accept}`).toBe(expected);
    }
    const plain = await request(app).get("/api/v1/openapi.json").set("Accept-Encoding", "identity");
    expect(plain.headers["content-encoding"]).toBeUndefined();
  });

  it("when the build precompressed an asset, then br goes to a brotli client, gz to a gzip-only one, the plain file to the others", async () => {
    // A second script, precompressed as the build does it (vite.config.ts -> scripts/precompress.ts).
    const name = "chunk-Ef56Gh78.js";
    writeFileSync(path.join(dist, "assets", name), bigScript.repeat(3));
    const report = precompressDir(path.join(dist, "assets"));
    expect(report.files).toBeGreaterThanOrEqual(1);
    const plainBytes = readFileSync(path.join(dist, "assets", name));
    const brBytes = readFileSync(path.join(dist, "assets", `${name}.br`));
    const gzBytes = readFileSync(path.join(dist, "assets", `${name}.gz`));
    // The twins hold the same script.
    expect(brotliDecompressSync(brBytes).equals(plainBytes)).toBe(true);
    expect(gunzipSync(gzBytes).equals(plainBytes)).toBe(true);

    const server = createHttpServer(buildTestApp(tdb, { CLIENT_DIST: dist }), testConfig(tdb.url));
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
    // Raw bytes as sent (node:http does not decode bodies), to tell a precompressed file from one compressed on the fly.
    const raw = (accept: string | undefined, file = name) =>
      new Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
        const { port } = server.address() as AddressInfo;
        httpGet({ host: "127.0.0.1", port, path: `/assets/${file}`, headers: accept === undefined ? {} : { "accept-encoding": accept } }, (res) => {
          const chunks: Buffer[] = [];
          res.on("data", (c: Buffer) => chunks.push(c));
          res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
        }).on("error", reject);
      });
    try {
      for (const accept of ["gzip, deflate, br, zstd", "br"]) {
        const br = await raw(accept);
        expect(br.status, accept).toBe(200);
        expect(br.headers["content-encoding"], accept).toBe("br");
        expect(br.body.equals(brBytes), `${accept}: the precompressed .br file itself`).toBe(true);
        expect(br.headers["content-type"]).toMatch(/javascript/);
        expect(br.headers.vary).toMatch(/Accept-Encoding/i);
        expect(br.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
      }
      const gz = await raw("gzip, deflate");
      expect(gz.headers["content-encoding"]).toBe("gzip");
      expect(gz.body.equals(gzBytes), "the precompressed .gz file itself").toBe(true);
      expect(gz.headers["content-type"]).toMatch(/javascript/);
      expect(gz.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
      // br refused by weight: gzip.
      expect((await raw("br;q=0, gzip")).headers["content-encoding"]).toBe("gzip");
      for (const accept of [undefined, "identity"]) {
        const plain = await raw(accept);
        expect(plain.status, String(accept)).toBe(200);
        expect(plain.headers["content-encoding"], String(accept)).toBeUndefined();
        expect(plain.body.equals(plainBytes), `${String(accept)}: the plain file`).toBe(true);
        expect(plain.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
      }
      // The twins are not files of their own, and a missing asset is still the plain 404.
      expect((await raw("br", `${name}.br`)).status).toBe(404);
      expect((await raw("br", "chunk-Missing1.js")).status).toBe(404);
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });

  it("when hashed assets are served, then they are immutable for a year; index.html is revalidated; a missing asset is a 404", async () => {
    const app = buildTestApp(tdb, { CLIENT_DIST: dist });
    const asset = await request(app).get("/assets/index-Ab12Cd34.js");
    expect(asset.headers["cache-control"]).toBe("public, max-age=31536000, immutable");
    for (const page of ["/", "/catalogue", "/index.html"]) {
      const res = await request(app).get(page);
      expect(res.status, page).toBe(200);
      expect(res.headers["cache-control"], page).toBe("no-cache");
    }
    expect((await request(app).get("/favicon.svg")).headers["cache-control"]).toBe("public, max-age=3600");
    const missing = await request(app).get("/assets/index-OldBuild.js");
    expect(missing.status).toBe(404);
    expect(missing.text).toMatch(/No such client file: \/assets\/index-OldBuild\.js/);
  });
});

describe("catalogue reads cached by catalogue revision", () => {
  it("when the list and a detail are read again, then one query (the revision token) answers; a publication is seen at once", async () => {
    await seedCatalogue(tdb.db);
    const app = buildTestApp(tdb);
    const first = await request(app).get("/api/v1/theories");
    expect(first.status).toBe(200);
    expect((await request(app).get("/api/v1/theories/edgb")).status).toBe(200);

    const queries: string[] = [];
    const count = (q: { sql: string }) => queries.push(q.sql);
    tdb.db.on("query", count);
    try {
      const again = await request(app).get("/api/v1/theories");
      expect(again.body).toEqual(first.body);
      const listQueries = queries.length;
      await request(app).get("/api/v1/theories/edgb");
      expect([listQueries, queries.length - listQueries]).toEqual([1, 1]);
    } finally {
      tdb.db.removeListener("query", count);
    }

    // What a publication does to the theories row: next revision number, new updated_at, new content.
    await tdb.db("theories").where({ slug: "edgb" }).update({ name: "EdGB (renamed by a test)", current_revision: tdb.db.raw("current_revision + 1"), updated_at: tdb.db.fn.now() });
    const list = await request(app).get("/api/v1/theories");
    expect(list.body.theories.find((t: { slug: string }) => t.slug === "edgb").name).toBe("EdGB (renamed by a test)");
    const detail = await request(app).get("/api/v1/theories/edgb");
    expect(detail.body.name).toBe("EdGB (renamed by a test)");
  });
});
