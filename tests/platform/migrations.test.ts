import { readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { migrations } from "../../migrations/index.ts";

describe("migrations/index.ts", () => {
  it("when a migration file exists, then it is listed (and nothing else is)", () => {
    const files = readdirSync(new URL("../../migrations", import.meta.url))
      .filter((f) => /^\d{14}_.+\.ts$/.test(f))
      .map((f) => f.replace(/\.ts$/, ""))
      .sort();
    expect(Object.keys(migrations).sort()).toEqual(files);
  });
  it("when listed, then every migration has up and down", () => {
    for (const [name, m] of Object.entries(migrations)) {
      expect(typeof m.up, name).toBe("function");
      expect(typeof m.down, name).toBe("function");
    }
  });
});
