/**
 * What a first visit costs: loads a page of a running Dragoman in Debian's chromium (playwright-core,
 * empty cache, brotli/gzip accepted as browsers do) and sums the bytes transferred (after compression)
 * per kind of resource: scripts, style sheets, fonts, API answers, the rest.
 *
 *   node --import tsx scripts/measure-first-load.ts [base URL] [path ...]
 *   (default http://127.0.0.1:$PORT or :3000, path /catalogue)
 *
 * tests/browser/first-load.test.ts asserts the budget on /catalogue; npm run bench prints the figures.
 */
import { chromium, type Request } from "playwright-core";
import { existsSync } from "node:fs";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

export const CHROMIUM_PATH = existsSync("/usr/lib/chromium/chromium") ? "/usr/lib/chromium/chromium" : "/usr/bin/chromium";

/** The goal for a first visit to /catalogue: compressed JavaScript, in bytes. */
export const FIRST_LOAD_JS_BUDGET = 200 * 1024;

export interface FirstLoad {
  url: string;
  /** Bytes on the wire (body after content encoding), by resource type. */
  bytes: { script: number; stylesheet: number; font: number; api: number; document: number; other: number };
  /** Uncompressed JavaScript, for comparison. */
  scriptDecoded: number;
  scripts: { url: string; transferred: number; encoding: string | null }[];
}

export async function measureFirstLoad(baseUrl: string, pagePath = "/catalogue"): Promise<FirstLoad> {
  const browser = await chromium.launchPersistentContext(mkdtempSync(path.join(tmpdir(), "dragoman-measure-")), {
    executablePath: CHROMIUM_PATH,
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-dev-shm-usage"],
  });
  try {
    const page = await browser.newPage();
    const finished: Request[] = [];
    page.on("requestfinished", (r) => finished.push(r));
    const url = new URL(pagePath, baseUrl).href;
    await page.goto(url, { waitUntil: "networkidle" });
    const bytes = { script: 0, stylesheet: 0, font: 0, api: 0, document: 0, other: 0 };
    let scriptDecoded = 0;
    const scripts: FirstLoad["scripts"] = [];
    for (const r of finished) {
      const sizes = await r.sizes();
      const response = await r.response();
      const transferred = sizes.responseBodySize;
      const type = r.resourceType();
      if (type === "script") {
        bytes.script += transferred;
        const body = await response?.body().catch(() => undefined);
        scriptDecoded += body?.length ?? 0;
        scripts.push({ url: r.url().replace(baseUrl, ""), transferred, encoding: (await response?.headerValue("content-encoding")) ?? null });
      } else if (type === "stylesheet") bytes.stylesheet += transferred;
      else if (type === "font") bytes.font += transferred;
      else if (type === "document") bytes.document += transferred;
      else if (type === "fetch" || type === "xhr") bytes.api += transferred;
      else bytes.other += transferred;
    }
    await page.close();
    return { url, bytes, scriptDecoded, scripts: scripts.sort((a, b) => b.transferred - a.transferred) };
  } finally {
    await browser.close();
  }
}

export function describeFirstLoad(m: FirstLoad): string {
  const kb = (n: number) => `${(n / 1024).toFixed(1)} kB`;
  const lines = [
    `first load of ${m.url} (empty cache, bytes on the wire):`,
    `  JavaScript   ${kb(m.bytes.script).padStart(10)}  (${kb(m.scriptDecoded)} uncompressed; budget ${kb(FIRST_LOAD_JS_BUDGET)})`,
    `  CSS          ${kb(m.bytes.stylesheet).padStart(10)}`,
    `  fonts        ${kb(m.bytes.font).padStart(10)}`,
    `  API answers  ${kb(m.bytes.api).padStart(10)}`,
    `  HTML         ${kb(m.bytes.document).padStart(10)}`,
    `  other        ${kb(m.bytes.other).padStart(10)}`,
    ...m.scripts.map((s) => `    ${kb(s.transferred).padStart(9)} ${s.encoding ?? "identity"}  ${s.url}`),
  ];
  return lines.join("\n");
}

const isMain = import.meta.url === `file://${process.argv[1]}`;
if (isMain) {
  const base = process.argv[2] ?? `http://127.0.0.1:${process.env.PORT ?? "3000"}`;
  const paths = process.argv.length > 3 ? process.argv.slice(3) : ["/catalogue"];
  (async () => {
    for (const p of paths) process.stdout.write(`${describeFirstLoad(await measureFirstLoad(base, p))}\n`);
  })().catch((err: unknown) => {
    process.stderr.write(`measure-first-load: ${err instanceof Error ? err.message : String(err)} (is Dragoman running at ${base}?)\n`);
    process.exit(1);
  });
}
