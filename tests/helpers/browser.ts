import { existsSync, mkdirSync, mkdtempSync } from "node:fs";
import { createServer, type RequestListener, type Server } from "node:http";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { expect } from "vitest";

/** Debian's chromium, driven by playwright-core. Never a downloaded browser. */
export const CHROMIUM = existsSync("/usr/lib/chromium/chromium") ? "/usr/lib/chromium/chromium" : "/usr/bin/chromium";
export const OUTPUT_DIR = path.resolve("test-output", "screenshots");

export async function launchBrowser(): Promise<BrowserContext> {
  mkdirSync(OUTPUT_DIR, { recursive: true });
  return chromium.launchPersistentContext(mkdtempSync(path.join(tmpdir(), "dragoman-chromium-")), {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--disable-dev-shm-usage",
    ],
  });
}

export function clientIsBuilt(): boolean {
  return existsSync(path.resolve("dist", "index.html"));
}

/** Records every request URL a page makes, so a test can assert nothing left 127.0.0.1. */
export function recordRequests(page: Page): string[] {
  const urls: string[] = [];
  page.on("request", (r) => urls.push(r.url()));
  return urls;
}

export function offLoopback(urls: string[]): string[] {
  return urls.filter((u) => {
    if (u.startsWith("data:") || u.startsWith("blob:") || u === "about:blank") return false;
    try {
      return new URL(u).hostname !== "127.0.0.1";
    } catch {
      return true;
    }
  });
}

export async function listen(handler: RequestListener): Promise<{ server: Server; url: string }> {
  const server = createServer(handler);
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const addr = server.address();
  const port = typeof addr === "object" && addr ? addr.port : 0;
  return { server, url: `http://127.0.0.1:${port}` };
}

export function screenshotPath(name: string): string {
  return path.join(OUTPUT_DIR, `${name}.png`);
}

/** A downloaded PNG: the PNG signature, an IHDR chunk of the width asked, and more bytes than a blank canvas takes. */
export function expectPng(bytes: Buffer, width: number): void {
  expect([...bytes.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  expect(bytes.subarray(12, 16).toString("ascii")).toBe("IHDR");
  expect(bytes.readUInt32BE(16)).toBe(width);
  expect(bytes.length).toBeGreaterThan(5000);
}
