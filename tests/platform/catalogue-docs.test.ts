import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { THEORIES_AMPLITUDE } from "../../seeds/data/theories-amplitude.ts";
import { johannsenPsaltis, remnantDeviation, ringdownDeviation } from "../../seeds/data/theories-ringdown.ts";
import { THEORIES_WAVE2, THEORIES_WAVE2_B, THEORIES_WAVE2_C } from "../../seeds/data/theories-wave2.ts";
import { THEORIES } from "../../seeds/data/theories.ts";

/** docs/catalogue.md promises a row per seeded entry with the status of its formulas; a new entry without one fails here. */
describe("docs/catalogue.md, the list of entries", () => {
  const docs = readFileSync(new URL("../../docs/catalogue.md", import.meta.url), "utf8");
  const rows = docs.split("\n").filter((l) => l.startsWith("| `"));
  const slugs = [...THEORIES, ringdownDeviation, remnantDeviation, johannsenPsaltis, ...THEORIES_WAVE2, ...THEORIES_WAVE2_B, ...THEORIES_WAVE2_C, ...THEORIES_AMPLITUDE].map((t) => t.slug);

  it("when an entry is seeded, then a row of the table names it and says whether its formulas are confirmed, derived or from memory", () => {
    expect(slugs.length).toBeGreaterThanOrEqual(25);
    for (const slug of new Set(slugs)) {
      // The dispersion family shares one row: `dispersion-a0p5`, `-a1p5`, ...
      const short = slug.startsWith("dispersion-") ? `\`-${slug.slice("dispersion-".length)}\`` : null;
      const row = rows.find((r) => r.includes(`\`${slug}\``) || (short !== null && r.startsWith("| `dispersion-") && r.includes(short)));
      expect(row, `docs/catalogue.md has no row for ${slug}`).toBeDefined();
      expect(row, slug).toMatch(/confirmed|derived|from memory/);
    }
  });
});
