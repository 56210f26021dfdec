// @vitest-environment jsdom
import { cleanup, render, screen, within } from "@testing-library/react";
import { MemoryRouter } from "react-router-dom";
import { afterEach, describe, expect, it } from "vitest";
import type { TheorySummary } from "../../common/catalogue.ts";
import { TheoryTable } from "../../client/features/catalogue/components/theory-table.tsx";

/** Invented list rows: one entry with a formula of each status (one retired), one with a single confirmed formula. */
function summary(slug: string, statuses: { status: TheorySummary["mappings"][number]["source_status"]; b: number; retired?: boolean }[]): TheorySummary {
  return {
    slug,
    name: `Invented theory ${slug}`,
    kind: "theory",
    family: "other",
    summary: "An invented entry for the list.",
    revision: 1,
    updated_at: "2026-01-05T10:00:00.000Z",
    source_to_be_confirmed: statuses.some((s) => s.status === "memory"),
    couplings: [{ symbol: "x", latex: "x", latex_html: null, unit: "1" }],
    mappings: statuses.map((s) => ({ kind: "inspiral_phase", b: s.b, a: null, pn_order: (s.b + 5) / 2, retired: s.retired ?? false, source_status: s.status })),
    references: [],
    retired: null,
  };
}

afterEach(cleanup);

describe("the catalogue list's formula status", () => {
  it("when an entry has formulas of each status, then its row says so in words and marks (not colour alone), counting only live formulas", () => {
    render(
      <MemoryRouter>
        <TheoryTable
          theories={[
            summary("mixed", [
              { status: "confirmed", b: -7 },
              { status: "derived", b: -5 },
              { status: "derived", b: -3 },
              { status: "memory", b: -1 },
              { status: "confirmed", b: 1, retired: true },
            ]),
            summary("plain", [{ status: "confirmed", b: -1 }]),
          ]}
        />
      </MemoryRouter>,
    );
    const mixed = screen.getByTestId("theory-row-mixed");
    expect(within(mixed).getByTestId("formula-status").textContent).toBe("Formulas:✓ 1 confirmed·∴ 2 derived·? 1 from memory");
    // Each mapping line carries its own word: 2 confirmed (one retired, marked so), 2 derived, 1 from memory.
    expect(within(mixed).getAllByText("confirmed", { exact: false }).length).toBeGreaterThanOrEqual(2);
    expect(within(mixed).getByText("(retired)")).toBeTruthy();
    expect(within(mixed).getByText("source to be confirmed")).toBeTruthy();
    const plain = screen.getByTestId("theory-row-plain");
    expect(within(plain).getByTestId("formula-status").textContent).toBe("Formulas:✓ 1 confirmed");
    expect(within(plain).queryByText("source to be confirmed")).toBeNull();
  });
});
