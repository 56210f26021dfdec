// Child process of bench/stall.bench.ts: the attacking client, in a process of its own so that its
// work (building and sending bodies of up to 24 MB) never delays the parent's health polling, whose
// latencies are the figure. Prepares every request, says "ready", attacks on "go", reports its answers.
import { craftedDefinitionChecks, hostileCorpus } from "../tests/helpers/hostile-corpus.ts";
import { ACCEPTED_SAMPLES, post, SAMPLES } from "./stall-common.ts";

function samplesBody(n: number, spoil: boolean): string {
  let seed = 12345;
  const rnd = () => {
    seed = (seed * 48271) % 2147483647;
    return seed / 2147483647;
  };
  const col = (lo: number, hi: number) => Array.from({ length: n }, () => lo + (hi - lo) * rnd());
  const m1 = col(10, 40);
  const columns: Record<string, unknown[]> = { beta: col(-1e-3, 1e-3), m1, m2: m1.map((m) => m * (0.3 + 0.6 * rnd())), chi1: col(-0.5, 0.5), chi2: col(-0.5, 0.5), z: col(0.05, 0.3) };
  // The audit's case: a body that is read and walked in full, then refused for its last value.
  if (spoil) (columns.m1 as unknown[])[n - 1] = "x";
  return JSON.stringify({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns });
}

function prepare(): Array<Array<[string, string]>> {
  const corpus = hostileCorpus(300);
  const crafted = craftedDefinitionChecks();
  const base = { target: "ppe_phase", b: -7, couplings: [{ symbol: "alpha", dimension: 2 }], definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }] };
  const bigBodies = [samplesBody(SAMPLES, false), samplesBody(SAMPLES, true), samplesBody(ACCEPTED_SAMPLES, false), samplesBody(ACCEPTED_SAMPLES, true)];
  const hostile: Array<[string, string]> = corpus.map((e) => ["/api/v1/expressions/check", JSON.stringify({ ...base, expression: e })]);
  const craftedItems: Array<[string, string]> = Array.from({ length: 60 }, (_, k) => ["/api/v1/expressions/check", JSON.stringify(crafted[k % crafted.length]?.body)]);
  const samples: Array<[string, string]> = Array.from({ length: 8 }, (_, k) => ["/api/v1/convert/samples", bigBodies[k % 4] as string]);
  const split = <T,>(xs: T[], n: number): T[][] => Array.from({ length: n }, (_, i) => xs.filter((_, k) => k % n === i));
  // STALL_PARTS=expressions or samples sends only that part (to see which one stalls).
  const parts = process.env.STALL_PARTS ?? "all";
  const expressions = parts === "samples" ? [] : [...split(hostile, 3), ...split(craftedItems, 2)];
  const bodies = parts === "expressions" ? [] : split(samples, 2);
  return [...expressions, ...bodies];
}

const url = process.env.STALL_URL ?? "";
const lanes = prepare();
process.on("message", (msg: { type: string }) => {
  if (msg.type !== "go") return;
  const counts = new Map<string, number>();
  const lane = async (items: Array<[string, string]>) => {
    for (const [path, body] of items) await post(url, path, body, counts);
  };
  void Promise.all(lanes.map(lane)).then(() => {
    process.send?.({ type: "done", counts: [...counts] }, () => process.exit(0));
  });
});
process.send?.({ type: "ready" });
