import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { convertResponseSchema } from "../../common/convert.ts";
import { symbolText } from "../../common/symbol-text.ts";
import { accountsSeed } from "../../seeds/accounts.ts";
import { amplitudeCatalogueSeed } from "../../seeds/amplitude-catalogue.ts";
import { catalogueSeed } from "../../seeds/catalogue.ts";
import { catalogueWave2bSeed, catalogueWave2cSeed, catalogueWave2Seed } from "../../seeds/catalogue-wave2.ts";
import { THEORIES_AMPLITUDE } from "../../seeds/data/theories-amplitude.ts";
import { edgbRingdownMappings, johannsenPsaltis, johannsenRingdownMappings, remnantDeviation, ringdownDeviation } from "../../seeds/data/theories-ringdown.ts";
import { THEORIES } from "../../seeds/data/theories.ts";
import { THEORIES_WAVE2, THEORIES_WAVE2_B, THEORIES_WAVE2_C } from "../../seeds/data/theories-wave2.ts";
import { seedSteps } from "../../seeds/index.ts";
import { ringdownCatalogueSeed } from "../../seeds/ringdown-catalogue.ts";
import { runForecast } from "../../server/physics/forecast/forecast.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

/**
 * Words people read: catalogue prose and the server's cautions write symbols (√α, ω_BD, Ġ/G, 16π α²/m₁⁴),
 * never the identifiers scripts use (sqrt_alpha, omega_BD, Gdot) nor ASCII mathematics (alpha^2, >>).
 * Common practice: papers and reviews write coupling symbols, not code names.
 */

interface Coupling {
  symbol: string;
  latex: string;
  quoted?: { symbol: string; latex: string };
}
interface Entry {
  slug: string;
  couplings?: readonly Coupling[];
}

const ENTRIES: readonly Entry[] = [
  ...THEORIES,
  ...THEORIES_WAVE2,
  ...THEORIES_WAVE2_B,
  ...THEORIES_WAVE2_C,
  ...THEORIES_AMPLITUDE,
  ringdownDeviation,
  remnantDeviation,
  johannsenPsaltis,
  { slug: "edgb (ringdown mappings)", ...{ mappings: edgbRingdownMappings } },
  { slug: "johannsen (ringdown mappings)", ...{ mappings: johannsenRingdownMappings } },
] as readonly Entry[];

/** Identifiers whose symbol reads differently (sqrt_alpha -> √α); m_g or c_M read the same and stay allowed. */
const IDENTIFIERS = [
  ...new Set(
    ENTRIES.flatMap((e) => e.couplings ?? []).flatMap((c) => [
      ...(symbolText(c.symbol, c.latex) !== c.symbol ? [c.symbol] : []),
      ...(c.quoted && symbolText(c.quoted.symbol, c.quoted.latex) !== c.quoted.symbol ? [c.quoted.symbol] : []),
    ]),
  ),
];
const GREEK_NAMES = ["alpha", "beta", "gamma", "delta", "epsilon", "zeta", "eta", "theta", "kappa", "lambda", "mu", "nu", "xi", "pi", "rho", "sigma", "tau", "phi", "chi", "psi", "omega", "Gamma", "Delta", "Theta", "Lambda", "Xi", "Sigma", "Phi", "Psi", "Omega"];
const word = (w: string) => new RegExp(`(?<![A-Za-z0-9_])${w.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}(?![A-Za-z0-9_])`);
const BANNED: readonly { what: string; re: RegExp }[] = [
  ...IDENTIFIERS.map((id) => ({ what: `identifier ${id}`, re: word(id) })),
  ...GREEK_NAMES.map((g) => ({ what: `spelled-out ${g}`, re: new RegExp(`(?<![A-Za-z])${g}(?![A-Za-z])`) })),
  { what: "ASCII comparison", re: /<<|>>|<=|>=/ },
  { what: "sqrt()", re: /\bsqrt\(/ },
  { what: "integer power written with ^", re: /\^-?\d(?!\d*[./]\d)/ },
  { what: "chirp-mass identifier", re: /\bln_Mc\b|\bMc\b/ },
];

function offences(text: string): string[] {
  return BANNED.filter((b) => b.re.test(text)).map((b) => b.what);
}

const PROSE_KEYS = new Set(["summary", "assumptions", "description", "notes", "note", "label", "caution", "frame_note", "locator", "data", "name"]);

/** Every prose string of an entry with its path (expressions, LaTeX and identifiers are not prose). */
function prose(value: unknown, path: string, key: string, out: { path: string; text: string }[]): void {
  if (typeof value === "string") {
    if (PROSE_KEYS.has(key)) out.push({ path, text: value });
  } else if (Array.isArray(value)) value.forEach((v, i) => prose(v, `${path}.${i}`, key, out));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) prose(v, path ? `${path}.${k}` : k, k, out);
}

describe("catalogue prose and server cautions write symbols, not identifiers (common practice)", () => {
  it("when the seeded entries are read, then no prose holds a coupling identifier, a spelled-out Greek letter or ASCII mathematics", () => {
    expect(IDENTIFIERS).toEqual(expect.arrayContaining(["sqrt_alpha", "omega_BD", "lambda_g", "Gdot", "B_dip"]));
    const texts: { path: string; text: string }[] = [];
    for (const e of ENTRIES) prose(e, e.slug, "", texts);
    expect(texts.length).toBeGreaterThan(300);
    const bad = texts.flatMap((t) => offences(t.text).map((o) => `${t.path}: ${o} in "${t.text}"`));
    expect(bad).toEqual([]);
    // The scan itself catches what it is for.
    expect(offences("EdGB coupling on body 1: 16 pi alpha^2 / m1^4 below 1/6")).toEqual(expect.arrayContaining(["identifier alpha", "spelled-out pi", "integer power written with ^"]));
    expect(offences("1/omega_BD < 0.1")).toContain("identifier omega_BD");
    expect(offences("16π α²/m₁⁴ < 1/6; ω_BD ≫ 1; f_low; m_g")).toEqual([]);
  });

  describe("POST /api/v1/convert over the whole seeded catalogue", () => {
    let tdb: TestDatabase;
    let app: ReturnType<typeof buildTestApp>;
    beforeAll(async () => {
      tdb = await createTestDatabase();
      await seedSteps(tdb.db, [accountsSeed, catalogueSeed, ringdownCatalogueSeed, catalogueWave2Seed, catalogueWave2bSeed, amplitudeCatalogueSeed, catalogueWave2cSeed]);
      app = buildTestApp(tdb, { RATE_LIMIT_PER_MINUTE: "1000" });
    }, 180_000);
    afterAll(async () => {
      await tdb?.drop();
    });

    it("when wide bounds are translated at every seeded b, then the cautions, validity labels and reasons people read hold no identifiers", async () => {
      const bs = [...new Set([...THEORIES, ...THEORIES_WAVE2, ...THEORIES_WAVE2_B, ...THEORIES_WAVE2_C].flatMap((e) => e.mappings.flatMap((m) => ("b" in m && typeof m.b === "number" ? [m.b] : []))))];
      expect(bs.length).toBeGreaterThan(5);
      const read: string[] = [];
      let outside = 0;
      for (const b of bs) {
        for (const bodies of [["bh", "bh"], ["ns", "bh"]] as const) {
          const res = await request(app)
            .post("/api/v1/convert")
            .send({ bound: { parameter: "ppe_beta", b, upper: 10, credibility: 0.9 }, binary: { m1: 10, m2: 5, chi1: 0.4, chi2: 0.1, bodies, frame: "source", z: 0.1 } });
          expect(res.status, JSON.stringify(res.body)).toBe(200);
          const body = convertResponseSchema.parse(res.body);
          for (const r of body.results) {
            read.push(...r.cautions.map((c) => c.message), ...r.validity.map((v) => v.label));
            if (r.verdict === "outside_validity") outside++;
          }
          read.push(...body.not_applicable.map((n) => n.reason));
        }
      }
      // The wide bound takes several theories outside validity, so the condition texts are really read.
      expect(outside).toBeGreaterThan(3);
      expect(read.some((t) => t.includes("16π α²/m₁⁴"))).toBe(true);
      const bad = [...new Set(read)].flatMap((t) => offences(t).map((o) => `${o} in "${t}"`));
      expect(bad).toEqual([]);
    }, 180_000);
  });

  it("when a forecast is degenerate or ill-conditioned, then its notes name the parameters as physicists do (ln ℳ, φ_c), not ln_Mc", () => {
    const r = runForecast({
      source: { m1: 30, m2: 30, chi1: 0, chi2: 0, frame: "source", distance_mpc: 400, z: 0.09 },
      detectors: [{ curve: "aligo-design" }, { curve: "aligo-design" }],
      networks: [[0], [0, 1]],
      b: [-7, -1, 0, 0.05, 2.95, 3],
      priors: { phi_c: null, chi_s: null, chi_a: null },
      coalescence: "phi_c_t_c_per_detector",
    });
    const notes = r.networks.flatMap((n) => [...n.cautions, ...n.rows.flatMap((row) => (row.note ? [row.note] : []))]);
    const texts = [...r.cautions, ...notes];
    expect(notes.length).toBeGreaterThan(2);
    expect(texts.filter((t) => /ln_|phi_c|chi_[sa]|\beta\b|\bdelta\b/.test(t))).toEqual([]);
    expect(texts.flatMap((t) => offences(t).map((o) => `${o} in "${t}"`))).toEqual([]);
  });
});
