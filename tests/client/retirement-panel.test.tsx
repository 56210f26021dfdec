// @vitest-environment jsdom
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { TheoryDetail } from "../../common/catalogue.ts";
import { RetirementPanel } from "../../client/features/catalogue/components/retirement.tsx";
import { createQueryClient } from "../../client/lib/query-client.ts";

/** An invented two-coupling entry, one mapping retired. */
function entry(over: Partial<TheoryDetail> = {}): TheoryDetail {
  const mapping = (i: number, coupling: string, retired: TheoryDetail["mappings"][number]["retired"]): TheoryDetail["mappings"][number] => ({
    id: i,
    kind: "inspiral_phase",
    pn_order: 2,
    b: -1,
    a: null,
    mode: null,
    expression: coupling,
    latex: coupling,
    coupling,
    held_fixed: null,
    alpha_md: null,
    frame_note: null,
    derivation: null,
    gimr_equivalent: null,
    body_rules: [],
    validity: [],
    source_status: "derived",
    source_to_be_confirmed: false,
    references: [],
    locator: null,
    notes: null, caution: null,
    checks: [],
    checks_ok: true,
    retired,
  });
  const coupling = (symbol: string): TheoryDetail["couplings"][number] => ({ symbol, latex: symbol, dimension: 0, unit: "1", quoted: null, description: null, convention: null, conventions: [], retired: null, range: null, gr_value: null });
  return {
    slug: "toy",
    name: "Toy spacetime",
    kind: "parameterized_spacetime",
    family: "parameterized-black-hole",
    summary: "x",
    action_latex: null,
    metric_latex: null,
    assumptions: [],
    revision: { number: 3, published_at: "2026-12-01T10:00:00.000Z" },
    couplings: [coupling("e3"), coupling("a13")],
    definitions: [],
    mappings: [mapping(0, "e3", null), mapping(1, "a13", { reason: "duplicate", at: "2026-12-01T10:00:00.000Z", by: "demo-editor" })],
    references: [],
    reference_bounds: [],
    source_to_be_confirmed: false,
    retired: null,
    ...over,
  };
}

let calls: { url: string; body: unknown }[] = [];
beforeEach(() => {
  calls = [];
  vi.stubGlobal(
    "fetch",
    vi.fn(async (url: string, init: RequestInit = {}) => {
      calls.push({ url, body: init.body ? JSON.parse(String(init.body)) : undefined });
      return new Response(JSON.stringify({ slug: "toy", revision: 4, target: "x", retired: null }), { status: 200, headers: { "Content-Type": "application/json" } });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPanel(theory: TheoryDetail) {
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <RetirementPanel theory={theory} />
    </QueryClientProvider>,
  );
}

describe("RetirementPanel", () => {
  it("when a mapping is retired, then it offers to restore exactly that mapping", async () => {
    renderPanel(entry());
    fireEvent.click(screen.getByRole("button", { name: /Restore mapping 2/ }));
    await waitFor(() => expect(calls).toHaveLength(1));
    expect(calls[0]?.url).toBe("/api/v1/theories/toy/restore");
    expect(calls[0]?.body).toEqual({ mapping: 1 });
  });

  it("when an editor picks a coupling and gives a reason, then the request retires that coupling with the reason", async () => {
    renderPanel(entry());
    const retire = screen.getByRole("button", { name: "Retire" });
    expect(retire).toHaveProperty("disabled", true);
    fireEvent.change(screen.getByLabelText("What"), { target: { value: "coupling:e3" } });
    fireEvent.change(screen.getByLabelText(/Reason/), { target: { value: "no field equations" } });
    fireEvent.click(retire);
    await waitFor(() => expect(calls).toHaveLength(1));
    expect(calls[0]?.url).toBe("/api/v1/theories/toy/retire");
    expect(calls[0]?.body).toEqual({ reason: "no field equations", coupling: "e3" });
  });

  it("when the whole entry is retired, then only a restore of the entry is offered", () => {
    renderPanel(entry({ retired: { reason: "withdrawn", at: "2026-12-01T10:00:00.000Z", by: null } }));
    expect(screen.getByRole("button", { name: /Restore the whole entry/ })).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Retire" })).toBeNull();
  });
});
