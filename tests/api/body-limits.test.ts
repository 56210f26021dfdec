import { request as httpRequest, type Server } from "node:http";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { DragomanApp } from "../../server/app.ts";
import { buildTestApp } from "../helpers/app.ts";
import { listen } from "../helpers/browser.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
let app: DragomanApp;
beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb, { JSON_BODY_MAX_BYTES: "4096" });
});
afterAll(async () => {
  await app.locals.checkPool.close();
  await tdb.drop();
});

/** Sends a request whose Content-Length announces `announced` bytes but sends only the first `sent`, and resolves on the answer. */
function announceOnly(url: string, path: string, announced: number, sent: number): Promise<{ status: number; body: string; sentBytes: number }> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(`${url}${path}`, { method: "POST", headers: { "content-type": "application/json", "content-length": String(announced) } }, (res) => {
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (c: string) => (body += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, body, sentBytes: sent }));
    });
    req.on("error", reject);
    // Only a fragment of the announced body: a server that waited to read it all would never answer.
    req.write("x".repeat(sent));
  });
}

describe("request bodies: limits per route, read after the rate limit", () => {
  let server: Server;
  let url: string;
  beforeAll(async () => {
    ({ server, url } = await listen(app));
  });
  afterAll(async () => {
    server.closeAllConnections();
    await new Promise<void>((resolve) => server.close(() => resolve()));
  });

  it("when a body announces more than the route's limit, then 413 naming the limit, answered before the body is read", async () => {
    // The submissions route has the default limit (4096 bytes here); 24 MB are announced, 10 bytes sent.
    const res = await announceOnly(url, "/api/v1/submissions", 24_000_000, 10);
    // Not signed in: the access rule answers first, without reading anything.
    expect(res.status).toBe(401);
    const sheets = await announceOnly(url, "/api/v1/convert", 24_000_000, 10);
    expect(sheets.status).toBe(413);
    const body = JSON.parse(sheets.body) as { error: { code: string; message: string; fields: Record<string, string> } };
    expect(body.error.code).toBe("payload_too_large");
    expect(body.error.message).toContain("24000000 bytes were announced");
    expect(body.error.message).toContain("at most 4 KiB (4096 bytes)");
    expect(body.error.fields).toEqual({ body: "larger than the limit of 4096 bytes" });
  });

  it("when a body without a length grows past the limit while streaming, then 413 naming the limit", async () => {
    const res = await new Promise<{ status: number; body: string }>((resolve, reject) => {
      // No Content-Length: Node sends the body chunked, and the server can only count as it reads.
      const req = httpRequest(`${url}/api/v1/convert`, { method: "POST", headers: { "content-type": "application/json" } }, (r) => {
        let body = "";
        r.setEncoding("utf8");
        r.on("data", (c: string) => (body += c));
        r.on("end", () => resolve({ status: r.statusCode ?? 0, body }));
      });
      req.on("error", reject);
      req.write('{"pad":"');
      for (let k = 0; k < 5; k += 1) req.write("x".repeat(1000));
      req.end('"}');
    });
    expect(res.status).toBe(413);
    const body = JSON.parse(res.body) as { error: { message: string } };
    expect(body.error.message).toContain("went past the limit while it was being read");
    expect(body.error.message).toContain("4096 bytes");
  });

  it("when a route declares its own limit, then it applies there: the expression check reads a 6 kB body the default would refuse", async () => {
    const res = await request(app)
      .post("/api/v1/expressions/check")
      .send({ expression: "alpha*m1/M", target: "ppe_phase", b: -7, couplings: [{ symbol: "alpha", dimension: 0 }], definitions: Array.from({ length: 40 }, (_, i) => ({ symbol: `d${i}`, expression: `m1+m2+${"z*".repeat(60)}z` })) });
    expect(res.status).toBe(200);
  });

  it("when a client is over its rate limit, then 429 before its body is read (the body is malformed and is never parsed)", async () => {
    const limited = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1" });
    const first = await request(limited).post("/api/v1/convert").set("Content-Type", "application/json").send("{ not json");
    expect(first.status).toBe(400);
    expect(first.body.error.code).toBe("malformed_json");
    const second = await request(limited).post("/api/v1/convert").set("Content-Type", "application/json").send("{ not json");
    expect(second.status).toBe(429);
    await limited.locals.checkPool.close();
  });

  it("when the body carries a NUL or a lone surrogate, then 400 naming its path (the text guard after the route's parser)", async () => {
    const nul = await request(app).post("/api/v1/expressions/check").send({ expression: "m1", target: "validity", couplings: [{ symbol: "a\u0000b", dimension: 0 }] });
    expect(nul.status).toBe(400);
    expect(nul.body.error.fields).toEqual({ "couplings.0.symbol": "contains a NUL character (U+0000)" });
    const surrogate = await request(app)
      .post("/api/v1/expressions/check")
      .set("Content-Type", "application/json")
      .send('{"expression":"m1","target":"validity","couplings":[],"definitions":[{"symbol":"x","expression":"\\ud800"}]}');
    expect(surrogate.status).toBe(400);
    expect(surrogate.body.error.fields).toEqual({ "definitions.0.expression": "contains a lone UTF-16 surrogate (not valid Unicode)" });
  });
});
