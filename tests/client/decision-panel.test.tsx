// @vitest-environment jsdom
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { SubmissionDetail } from "../../common/catalogue.ts";
import { blockingChecks, DecisionPanel } from "../../client/features/review/components/decision-panel.tsx";
import { createQueryClient } from "../../client/lib/query-client.ts";

/** A submission in review whose first mapping fails the engine's dimension check (invented example). */
function inReview(results: SubmissionDetail["checks"]["results"]): SubmissionDetail {
  const failures = results.filter((r) => !r.ok && r.severity === "error").length;
  return {
    id: 12,
    status: "in_review",
    version: 2,
    target_slug: null,
    slug: "panel-test",
    name: "Panel test entry",
    author: { id: 5, login: "demo-theorist", name: "Amara Venn" },
    checks_ok: failures === 0,
    created_at: "2026-12-01T10:00:00.000Z",
    updated_at: "2026-12-01T10:00:00.000Z",
    submitted_at: "2026-12-01T10:00:00.000Z",
    decided_at: null,
    revision: null,
    theory: {
      slug: "panel-test",
      name: "Panel test entry",
      kind: "theory",
      family: "other",
      summary: "x",
      assumptions: [],
      couplings: [{ symbol: "alpha", latex: "\\alpha", dimension: 2, unit: "km^2", conventions: [] }],
      definitions: [],
      mappings: [{ kind: "inspiral_phase", pn_order: -1, b: -7, expression: "alpha", body_rules: [], validity: [], source_status: "confirmed", references: [] }],
      references: [{ authors: ["A. Author"], title: "T", year: 2020 }],
      reference_bounds: [],
    },
    checks: { ok: failures === 0, failures, warnings: 0, results, checked_at: "2026-12-01T10:00:00.000Z" },
    target_revision: null,
    diff: null,
  authors: [],
  since_returned: null,
  };
}

const dimensionFailed = { path: "mappings.0", name: "dimension", ok: false, severity: "error" as const, message: "expression has dimension length^2" };
const passed = { path: "mappings.0", name: "parse", ok: true, severity: "info" as const, message: "expression parses" };
const warned = { path: "mappings.0", name: "derivation", ok: false, severity: "warning" as const, message: "not compared" };

let bodies: unknown[] = [];
beforeEach(() => {
  bodies = [];
  vi.stubGlobal(
    "fetch",
    vi.fn(async (_url: string, init: RequestInit = {}) => {
      bodies.push(init.body ? JSON.parse(String(init.body)) : undefined);
      return new Response(JSON.stringify({ id: 12, status: "returned", version: 2 }), { status: 200, headers: { "Content-Type": "application/json" } });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderPanel(s: SubmissionDetail, own = false) {
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <DecisionPanel submission={s} ownSubmission={own} />
    </QueryClientProvider>,
  );
}

describe("<DecisionPanel>", () => {
  it("when a check failed with severity error, then accepting is disabled and the panel names the mapping and check", () => {
    renderPanel(inReview([passed, dimensionFailed]));
    expect((screen.getByRole("button", { name: "Accept and publish" }) as HTMLButtonElement).disabled).toBe(true);
    expect(screen.getByTestId("accept-blocked").textContent).toContain("mappings.0: Dimension — expression has dimension length^2");
    // Returning stays possible: that is how the author hears about the failure.
    expect((screen.getByRole("button", { name: "Return to the author" }) as HTMLButtonElement).disabled).toBe(false);
  });

  it("when only warnings remain, then accepting is allowed", () => {
    renderPanel(inReview([passed, warned]));
    expect((screen.getByRole("button", { name: "Accept and publish" }) as HTMLButtonElement).disabled).toBe(false);
    expect(screen.queryByTestId("accept-blocked")).toBeNull();
    expect(blockingChecks(inReview([passed, warned]))).toEqual([]);
  });

  it("when returning without a comment, then the decision schema's message shows and nothing is sent; with one, it is sent", async () => {
    renderPanel(inReview([passed]));
    fireEvent.click(screen.getByRole("button", { name: "Return to the author" }));
    expect(screen.getByRole("alert").textContent).toContain("is required when returning a submission");
    expect(bodies).toEqual([]);
    fireEvent.change(screen.getByLabelText("Comment to the author"), { target: { value: "Please cite the flux derivation." } });
    fireEvent.click(screen.getByRole("button", { name: "Return to the author" }));
    await waitFor(() => expect(bodies).toEqual([{ decision: "return", comment: "Please cite the flux derivation." }]));
  });

  it("when the editor wrote the submission, then no decision buttons are offered", () => {
    renderPanel(inReview([passed]), true);
    expect(screen.queryByRole("button", { name: "Accept and publish" })).toBeNull();
    expect(screen.getByText("You wrote this submission")).toBeTruthy();
  });
});
