import { describe, expect, it } from "vitest";
import { presetState, stateFromRequest, toRequest } from "../../client/features/forecast/components/forecast-form.tsx";
import { readForecastParam, requestFieldErrors, runsAsJob } from "../../client/features/forecast/lib/forecast-url.ts";

describe("the forecast page's address", () => {
  it("when the form's request goes into ?q= and comes back, then the form shows the same request", () => {
    const state = { ...presetState("multiband"), m1: "40", b: "-7, -3", coalescence: "phi_c_t_c_per_detector" as const, phi_c: "" };
    const input = toRequest(state);
    const url = readForecastParam(JSON.stringify(input));
    expect(url.kind).toBe("ok");
    if (url.kind !== "ok") return;
    const back = toRequest(stateFromRequest(url.request));
    expect(back).toEqual({ ...input, priors: { phi_c: null, chi_s: 1, chi_a: 1 } });
    expect(runsAsJob(url.request)).toBe(false);
  });

  it("when a link is cut or names a bad field, then it is refused with the field, not replaced silently", () => {
    expect(readForecastParam('{"source":')).toMatchObject({ kind: "bad" });
    const bad = readForecastParam(JSON.stringify({ ...toRequest(presetState("ground")), credibility: 2 }));
    expect(bad).toMatchObject({ kind: "bad" });
    if (bad.kind === "bad") expect(bad.message).toMatch(/^credibility/);
    expect(readForecastParam(null)).toEqual({ kind: "none" });
  });

  it("when more than 40 values of b are asked, then the link is still valid and the page runs it as a job; the form's own errors name the field", () => {
    const many = { ...presetState("ground"), b: Array.from({ length: 60 }, (_, i) => -15 + i * 0.25).join(", ") };
    const url = readForecastParam(JSON.stringify(toRequest(many)));
    expect(url.kind).toBe("ok");
    if (url.kind === "ok") expect(runsAsJob(url.request)).toBe(true);
    expect(requestFieldErrors(toRequest({ ...presetState("ground"), m1: "-3" }))).toHaveProperty(["source.m1"]);
  });

  it("when more binaries are listed, then they travel in the link with the first binary's spins and distance, and make the forecast a job", () => {
    const state = { ...presetState("ground"), more: "20, 15\n 60;50 \n" };
    const input = toRequest(state);
    expect(input.more_sources).toEqual([
      { ...input.source, m1: 20, m2: 15 },
      { ...input.source, m1: 60, m2: 50 },
    ]);
    const url = readForecastParam(JSON.stringify(input));
    expect(url.kind).toBe("ok");
    if (url.kind !== "ok") return;
    expect(runsAsJob(url.request)).toBe(true);
    expect(stateFromRequest(url.request).more).toBe("20, 15\n60, 50");
    expect(requestFieldErrors(toRequest({ ...state, more: "20, x" }))).toHaveProperty(["more_sources.0.m2"]);
  });
});
