import type { RingdownResult } from "./ringdown.ts";

/**
 * A ringdown result's limit in one line, for tables and exports: a signed interval when both sides are
 * limited (lower <= x <= upper, in the coupling's own unit), else the magnitude limit in the quoted unit
 * (sqrt(alpha) <= 24 km) when there is one, else the one side there is. Null when there is no limit.
 */
export interface RingdownLimit {
  symbol: string;
  latex: string;
  unit: string;
  side: "upper" | "lower";
  value: number;
  signed_interval: { lower: number; upper: number } | null;
}

export function ringdownLimitOf(r: RingdownResult): RingdownLimit | null {
  if (r.status !== "bounded" || !r.coupling) return null;
  const c = r.coupling;
  if (r.lower && r.upper) {
    return { symbol: c.symbol, latex: c.latex, unit: c.unit, side: "upper", value: Math.max(Math.abs(r.lower.value), Math.abs(r.upper.value)), signed_interval: { lower: r.lower.value, upper: r.upper.value } };
  }
  if (r.limit) return { symbol: r.limit.symbol, latex: r.limit.latex, unit: r.limit.unit, side: r.limit.side, value: r.limit.value, signed_interval: null };
  if (r.upper) return { symbol: c.symbol, latex: c.latex, unit: c.unit, side: "upper", value: r.upper.value, signed_interval: null };
  if (r.lower) return { symbol: c.symbol, latex: c.latex, unit: c.unit, side: "lower", value: r.lower.value, signed_interval: null };
  return null;
}

/** Stretched conditions at either limit (a rule of thumb exceeded by at most 10 times, kept as valid). */
export function ringdownStretched(r: RingdownResult): boolean {
  return [...(r.lower?.validity ?? []), ...(r.upper?.validity ?? [])].some((v) => v.status !== "ok");
}

/** "|δf/f| ≤ 0.05 for the (2,2,0) mode, 90% credibility": the bound as a sentence. */
export function ringdownBoundText(bound: { parameter: "qnm_dfreq" | "qnm_dtau"; mode: string; interval: readonly [number | null, number | null]; credibility: number }, upper?: number): string {
  const symbol = bound.parameter === "qnm_dfreq" ? "δf/f" : "δτ/τ";
  const sig = (x: number) => Number(x.toPrecision(3)).toString();
  const [lo, hi] = bound.interval;
  const value =
    upper !== undefined
      ? `|${symbol}| ≤ ${sig(upper)}`
      : lo !== null && hi !== null
        ? `${symbol} ∈ [${sig(lo)}, ${sig(hi)}]`
        : lo !== null
          ? `${symbol} ≥ ${sig(lo)}`
          : `${symbol} ≤ ${sig(hi ?? Number.NaN)}`;
  return `${value} for the (${bound.mode.split("").join(",")}) mode, ${Math.round(bound.credibility * 1000) / 10}% credibility`;
}
