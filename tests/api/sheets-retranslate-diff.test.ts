import { describe, expect, it } from "vitest";
import { convertRequestSchema, type ConvertResponse } from "../../common/convert.ts";
import { translate } from "../../server/features/convert/translate.ts";
import { entryRevisions } from "../../server/features/sheets/record-build.ts";
import { entryChanges, limitChanges } from "../../server/features/sheets/retranslate.ts";
import { seedCatalogue } from "./convert-fixture.ts";

/** The comparison a re-translation preview shows: per limit, same / changed / added / removed, with verdict changes and the ratio. */

function saved(): ConvertResponse {
  const req = convertRequestSchema.parse({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
  return translate(seedCatalogue(), req);
}

describe("limitChanges", () => {
  it("when nothing changed, then every limit reads the same", () => {
    const a = saved();
    const changes = limitChanges(a, saved());
    expect(changes.length).toBe(a.results.length);
    expect(changes.every((c) => c.status === "same" && !c.verdict_changed && c.ratio === 1)).toBe(true);
  });

  it("when a value moves, a verdict flips, a limit goes and another comes, then each is reported with old and new", () => {
    const old = saved();
    expect(old.results.length).toBeGreaterThanOrEqual(2);
    // The saved translation also had a limit from an entry that no longer gives one.
    old.results.push({ ...structuredClone(old.results[0]!), theory: "retired-theory", theory_name: "Retired theory (test)" });
    const next = structuredClone(old);
    next.results = next.results.filter((r) => r.theory !== "retired-theory");
    next.not_applicable.push({ theory: "retired-theory", theory_name: "Retired theory (test)", code: "different_b", reason: "enters at another b now (test)", b: [-5] });
    const [first, second] = next.results;
    first!.coupling.value *= 2;
    second!.verdict = second!.verdict === "valid" ? "outside_validity" : "valid";
    next.results.push({ ...structuredClone(old.results[0]!), theory: "invented-theory", theory_name: "Invented theory (test)" });
    const changes = limitChanges(old, next);
    const by = (t: string) => changes.find((c) => c.theory === t)!;
    expect(by(first!.theory)).toMatchObject({ status: "changed", verdict_changed: false, ratio: 2 });
    expect(by(first!.theory).new!.value).toBe(2 * by(first!.theory).old!.value);
    expect(by(second!.theory)).toMatchObject({ status: "changed", verdict_changed: true });
    expect(by("retired-theory")).toMatchObject({ status: "removed", new: null, reason: "enters at another b now (test)" });
    expect(by("invented-theory")).toMatchObject({ status: "added", old: null });
  });
});

describe("entryChanges", () => {
  it("when entries changed since a translation, then only those that gave a limit or map at its b are named; a retired one keeps its name", () => {
    const catalogue = seedCatalogue();
    const now = entryRevisions(catalogue);
    const translation = saved(); // b = -7
    const atB = catalogue.theories.filter((t) => t.bs.includes(-7)).map((t) => t.theory.slug);
    const elsewhere = catalogue.theories.find((t) => !t.bs.includes(-7) && !t.noPhaseMapping)!.theory.slug;
    const gaveLimit = translation.results[0]!;
    // Then: every entry one revision older, the entry at another b and one at b = -7 absent (new since),
    // and the entry that gave the first limit absent now (retired since).
    const was: Record<string, number> = Object.fromEntries(Object.entries(now).map(([k, v]) => [k, v - 1]));
    delete was[elsewhere];
    const newAtB = atB.find((s) => s !== gaveLimit.theory)!;
    delete was[newAtB];
    was[gaveLimit.theory] = now[gaveLimit.theory]!;
    const nowWithout = { ...now };
    delete nowWithout[gaveLimit.theory];
    const changes = entryChanges(was, catalogue, nowWithout, translation);
    const slugs = changes.map((c) => c.theory);
    // The entry at another b, new or revised, changes nothing for a bound at b = -7.
    expect(slugs).not.toContain(elsewhere);
    expect(changes.find((c) => c.theory === newAtB)).toMatchObject({ was: null, now: now[newAtB] });
    expect(changes.find((c) => c.theory === gaveLimit.theory)).toMatchObject({ name: gaveLimit.theory_name, now: null });
    expect(slugs.every((s) => atB.includes(s))).toBe(true);
  });
});
