import { writeFileSync } from "node:fs";
import type { Reporter, TestModule } from "vitest/node";

/**
 * CI reads a plain closing line "N passed, N failed"; vitest's own summary is not in that form.
 * The counts also go to a JSON file (SUMMARY_FILE) so scripts/test.sh can add its static checks.
 */
export default class SummaryReporter implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>) {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const m of modules) {
      const tests = [...m.children.allTests()];
      for (const t of tests) {
        const s = t.result().state;
        if (s === "passed") passed++;
        else if (s === "failed") failed++;
        else skipped++;
      }
      // A file that fails to load has no tests: count it as one failure, never as zero.
      if (m.state() === "failed" && tests.length === 0) failed++;
    }
    const file = process.env.SUMMARY_FILE;
    if (file) writeFileSync(file, JSON.stringify({ passed, failed, skipped }));
    process.stdout.write(`\nvitest: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}\n`);
  }
}
