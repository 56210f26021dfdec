import { readFileSync } from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";

const AXE_SOURCE = readFileSync(path.resolve("node_modules", "axe-core", "axe.min.js"), "utf8");

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[]; failureSummary?: string }[];
}

/** The serious and critical accessibility violations axe-core finds on the page, one line each. */
export async function axeSerious(page: Page): Promise<string[]> {
  // Evaluated through the DevTools protocol: the app's CSP (script-src 'self') refuses an inline script tag.
  await page.evaluate(AXE_SOURCE);
  const violations = (await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: unknown[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ["violations"] });
    return result.violations;
  })) as Violation[];
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.slice(0, 3).map((n) => `${n.target.join(" ")} [${n.failureSummary ?? ""}]`).join("; ")}`);
}
