// @vitest-environment jsdom
import { cleanup, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it } from "vitest";
import { CheckList, checkOutcome, worstOutcome, type CheckResult } from "../../client/components/ui/check-list.tsx";

afterEach(cleanup);

// Shaped as the server reports a check stopped by its time limit (server/features/expressions/check-runner.ts).
const stopped: CheckResult = { name: "evaluation", ok: false, severity: "inconclusive", message: "the checks after dimension did not finish within the time limit of 8000 ms; inconclusive (not a failure)" };
const passed: CheckResult = { name: "dimension", ok: true, message: "expression is dimensionless" };
const failed: CheckResult = { name: "gr_limit", ok: false, severity: "error", message: "does not vanish" };

describe("an inconclusive check in the client", () => {
  it("when a check was stopped by its time limit, then it is its own outcome: not ok, not failed", () => {
    expect(checkOutcome(stopped)).toBe("inconclusive");
    expect(worstOutcome([passed, stopped])).toBe("inconclusive");
    // A real failure still outranks it.
    expect(worstOutcome([stopped, failed])).toBe("failed");
  });

  it("when the list shows it, then it is marked inconclusive, with its message", () => {
    render(<CheckList checks={[passed, stopped]} testId="list" />);
    const item = screen.getByTestId("list").querySelector('[data-check="evaluation"]');
    expect(item?.getAttribute("data-outcome")).toBe("inconclusive");
    expect(item?.textContent).toContain("inconclusive");
    expect(item?.textContent).toContain("not a failure");
  });
});
