// @vitest-environment jsdom
import { cleanup, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { CheckBadge, CheckList, checkLabel, checkOutcome, worstOutcome, type CheckResult } from "../../client/components/ui/check-list.tsx";

afterEach(cleanup);

// Check results shaped as the engine reports them (server/physics/checks/types.ts): severity "warning"
// marks a passed check the contributor should still read; "error" a failed one.
const passed: CheckResult = { name: "parse", ok: true, message: "expression parses" };
const passedWithWarning: CheckResult = { name: "derivation", ok: true, severity: "warning", message: "not compared" };
const failedDimension: CheckResult = { name: "dimension", ok: false, severity: "error", message: "expression has dimension length^2; beta must be dimensionless" };
const failedNoSeverity: CheckResult = { name: "gr_limit", ok: false, message: "does not vanish when alpha = 0" };

describe("check outcomes", () => {
  it("when a check passed, then it is ok; with a warning severity, a warning even though it passed", () => {
    expect(checkOutcome(passed)).toBe("ok");
    expect(checkOutcome(passedWithWarning)).toBe("warning");
  });

  it("when a check failed, then it is failed whether or not it names a severity", () => {
    expect(checkOutcome(failedDimension)).toBe("failed");
    expect(checkOutcome(failedNoSeverity)).toBe("failed");
    expect(checkOutcome({ ...failedNoSeverity, severity: "warning" })).toBe("warning");
  });

  it("when several checks are combined, then the worst one decides the badge", () => {
    expect(worstOutcome([])).toBe("ok");
    expect(worstOutcome([passed, passedWithWarning])).toBe("warning");
    expect(worstOutcome([passedWithWarning, failedDimension, passed])).toBe("failed");
  });

  it("when a check name is shown, then GR and PN are capitalised and underscores become spaces", () => {
    expect(checkLabel("gr_limit")).toBe("GR limit");
    expect(checkLabel("pn_order")).toBe("PN order");
    expect(checkLabel("dimension")).toBe("Dimension");
  });
});

describe("<CheckBadge> and <CheckList>", () => {
  it("when rendered, then each badge says its outcome in words, not only in colour", () => {
    render(
      <>
        <CheckBadge outcome="ok" />
        <CheckBadge outcome="warning" />
        <CheckBadge outcome="failed" />
      </>,
    );
    expect(screen.getByText("ok")).toBeTruthy();
    expect(screen.getByText("warning")).toBeTruthy();
    expect(screen.getByText("failed")).toBeTruthy();
  });

  it("when given mixed results, then every check is listed with its outcome, label and message", () => {
    const { container } = render(<CheckList checks={[passed, passedWithWarning, failedDimension]} testId="list" />);
    const rows = [...container.querySelectorAll("[data-check]")].map((li) => [li.getAttribute("data-check"), li.getAttribute("data-outcome")]);
    expect(rows).toEqual([
      ["parse", "ok"],
      ["derivation", "warning"],
      ["dimension", "failed"],
    ]);
    const dimension = container.querySelector('[data-check="dimension"]');
    expect(dimension?.textContent).toContain("Dimension");
    expect(dimension?.textContent).toContain("β must be dimensionless");
    expect(dimension?.textContent).toContain("failed");
  });

  it("when only problems are asked for, then passing checks are hidden but warnings stay", () => {
    const { container } = render(<CheckList checks={[passed, passedWithWarning, failedDimension]} onlyProblems />);
    expect([...container.querySelectorAll("[data-check]")].map((li) => li.getAttribute("data-check"))).toEqual(["derivation", "dimension"]);
  });

  it("when all checks pass under onlyProblems, then it says how many passed; with none, that none ran", () => {
    const { rerender } = render(<CheckList checks={[passed, { ...passed, name: "symbols" }]} onlyProblems />);
    expect(screen.getByText("All 2 checks passed.")).toBeTruthy();
    rerender(<CheckList checks={[]} />);
    expect(screen.getByText("No checks have run yet.")).toBeTruthy();
  });
});
