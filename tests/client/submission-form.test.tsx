// @vitest-environment jsdom
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, configure, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { MemoryRouter } from "react-router-dom";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { SubmissionForm, type SubmissionFormProps } from "../../client/features/submissions/components/submission-form.tsx";
import type { SubmissionFormInput } from "../../client/features/submissions/components/form-values.ts";
import { applyServerErrors, isRenderedPath } from "../../client/features/submissions/components/server-errors.ts";
import { ApiError } from "../../client/lib/api-client.ts";
import { createQueryClient } from "../../client/lib/query-client.ts";

// The live checks are debounced and the form is large: on a loaded machine jsdom needs more than the
// default 1 s to settle, so every wait here may take up to 10 s (it ends as soon as the text is there).
configure({ asyncUtilTimeout: 10_000 });

/**
 * The submission form against a stubbed fetch: field errors from the server land on their fields,
 * a stale save shows the newer version without losing the typed values, and the engine's verdict
 * appears under the expression as it is typed.
 *
 * The entry is the scalar-dipole phase term at -1PN (Yagi 2012 EdGB dipole term):
 * beta = -(5/7168) zeta (m1^2 s2 - m2^2 s1)^2 / (M^4 eta^(18/5)), zeta = 16 pi alpha^2 / M^4.
 */
function validInput(): SubmissionFormInput {
  return {
    theory: {
      slug: "form-test-dipole",
      name: "Form test dipole",
      family: "scalar-tensor",
      summary: "A test entry for the form.",
      couplings: [{ symbol: "alpha", latex: "\\alpha", dimension: 2, unit: "km^2", conventions: [] }],
      definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
      mappings: [
        {
          kind: "inspiral_phase",
          pn_order: -1,
          b: -7,
          expression: "-(5/7168)*zeta*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))",
          source_status: "derived",
          references: ["yp2009"],
          validity: [],
          body_rules: [],
        },
      ],
      // Yunes & Pretorius 2009, Phys. Rev. D 80, 122003, arXiv:0909.3328.
      references: [{ key: "yp2009", arxiv: "0909.3328", authors: "N. Yunes and F. Pretorius", title: "Fundamental theoretical bias in gravitational wave astrophysics and the parametrized post-Einsteinian framework", year: 2009 }],
      reference_bounds: [],
      assumptions: [],
    },
  };
}

const checksReport = { ok: true, failures: 0, warnings: 0, results: [], checked_at: "2026-12-01T10:00:00.000Z" };

interface Call {
  method: string;
  url: string;
  body: unknown;
}

type Responder = (call: Call) => { status: number; body: unknown } | undefined;

let calls: Call[] = [];
let responders: Responder[] = [];

function json(status: number, body: unknown) {
  return new Response(JSON.stringify(body), { status, headers: { "Content-Type": "application/json" } });
}

beforeEach(() => {
  calls = [];
  responders = [];
  vi.stubGlobal(
    "fetch",
    vi.fn(async (url: string, init: RequestInit = {}) => {
      const call = { method: init.method ?? "GET", url, body: init.body ? JSON.parse(String(init.body)) : undefined };
      calls.push(call);
      for (const r of responders) {
        const answer = r(call);
        if (answer) return json(answer.status, answer.body);
      }
      return json(404, { error: { code: "not_found", message: `no stub for ${call.method} ${url}` } });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function renderForm(props: Partial<SubmissionFormProps> = {}) {
  const client = createQueryClient();
  return render(
    <QueryClientProvider client={client}>
      <MemoryRouter>
        <SubmissionForm initial={validInput()} canSubmit {...props} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

/** The message a control's aria-describedby points at. */
function noteOf(control: HTMLElement): string {
  const id = control.getAttribute("aria-describedby");
  return id ? (document.getElementById(id)?.textContent ?? "") : "";
}

const saves = () => calls.filter((c) => c.url.startsWith("/api/v1/submissions"));

describe("submission form: where the server's field errors land", () => {
  it("when the server answers 400 with field paths, then each message sits on its field and the unrendered one in the summary", async () => {
    responders.push((c) =>
      c.method === "POST" && c.url === "/api/v1/submissions"
        ? {
            status: 400,
            body: {
              error: {
                code: "validation_error",
                message: "Invalid request body: theory.mappings.0.expression: uses ':=', which is not allowed",
                fields: {
                  "theory.mappings.0.expression": "uses ':=', which is not allowed",
                  "theory.couplings.0.unit": "is not a unit the catalogue knows",
                  "theory.reference_bounds.0.value": "must be a finite number",
                },
              },
            },
          }
        : undefined,
    );
    renderForm();
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));

    const expression = await screen.findByLabelText("Expression for β");
    await waitFor(() => expect(expression.getAttribute("aria-invalid")).toBe("true"));
    expect(noteOf(expression)).toBe("uses ':=', which is not allowed");
    const unit = within(screen.getByTestId("coupling-fields-0")).getByLabelText("Unit");
    expect(unit.getAttribute("aria-invalid")).toBe("true");
    expect(noteOf(unit)).toBe("is not a unit the catalogue knows");

    const summary = screen.getByTestId("error-summary");
    expect(summary.textContent).toContain("reference_bounds.0.value: must be a finite number");
    expect(summary.textContent).toContain("mappings.0.expression: uses ':='");
    expect(saves()).toHaveLength(1);
    expect(saves()[0]?.body).toMatchObject({ theory: { slug: "form-test-dipole", mappings: [{ b: -7, pn_order: -1 }] } });
    // The typed values survive the refusal.
    expect((expression as HTMLTextAreaElement).value).toContain("zeta*(m1^2*s2");
  });

  it("when a field is empty, then zod (the server's own schema) flags it on the client and nothing is sent", async () => {
    renderForm();
    const name = screen.getByLabelText("Name");
    fireEvent.change(name, { target: { value: "   " } });
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));
    await waitFor(() => expect(name.getAttribute("aria-invalid")).toBe("true"));
    expect(noteOf(name)).toBe("must not be empty");
    expect(saves()).toHaveLength(0);
  });

  it("when the slug is already taken (409 naming theory.slug), then the message lands on the slug field", async () => {
    responders.push((c) =>
      c.method === "POST" && c.url === "/api/v1/submissions"
        ? {
            status: 409,
            body: { error: { code: "conflict", message: 'theory.slug: "form-test-dipole" is already in the catalogue; to change it, send target_slug "form-test-dipole".', details: { field: "theory.slug", slug: "form-test-dipole" } } },
          }
        : undefined,
    );
    renderForm();
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));
    const slug = screen.getByLabelText("Short name (in the address)");
    await waitFor(() => expect(slug.getAttribute("aria-invalid")).toBe("true"));
    expect(noteOf(slug)).toBe('"form-test-dipole" is already in the catalogue; to change it, send target_slug "form-test-dipole".');
  });

  it("when the saved version is stale (409), then it names the newer version, keeps the edits, and can load the newer one and bring the edits back", async () => {
    responders.push((c) =>
      c.method === "PATCH" && c.url === "/api/v1/submissions/7"
        ? {
            status: 409,
            body: { error: { code: "conflict", message: "Submission #7 was saved by someone else meanwhile: it is at version 4, you sent version 3.", details: { current_version: 4, your_version: 3 } } },
          }
        : undefined,
    );
    const theirs = validInput().theory;
    theirs.name = "Form test dipole (editor's wording)";
    responders.push((c) =>
      c.method === "GET" && c.url === "/api/v1/submissions/7"
        ? {
            status: 200,
            body: {
              id: 7,
              status: "in_review",
              version: 4,
              target_slug: null,
              slug: theirs.slug,
              name: theirs.name,
              author: { id: 3, login: "demo-theorist", name: "Amara Venn" },
              checks_ok: true,
              created_at: "2026-12-01T10:00:00.000Z",
              updated_at: "2026-12-01T11:00:00.000Z",
              submitted_at: "2026-12-01T10:30:00.000Z",
              decided_at: null,
              revision: null,
              theory: { ...theirs, references: theirs.references.map((r) => ({ ...r, authors: ["N. Yunes", "F. Pretorius"] })) },
              checks: checksReport,
              target_revision: null,
              diff: null,
              authors: [],
              since_returned: null,
            },
          }
        : undefined,
    );
    renderForm({ id: 7, version: 3, status: "in_review", canSubmit: false });
    const name = screen.getByLabelText("Name") as HTMLInputElement;
    fireEvent.change(name, { target: { value: "Form test dipole (my wording)" } });
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));

    const conflict = await screen.findByTestId("conflict");
    expect(conflict.textContent).toContain("A newer version 4 exists.");
    expect(name.value).toBe("Form test dipole (my wording)");
    expect(saves()[0]?.body).toMatchObject({ version: 3 });

    fireEvent.click(within(conflict).getByRole("button", { name: /Load version 4/ }));
    await waitFor(() => expect(name.value).toBe("Form test dipole (editor's wording)"));
    expect(screen.getByTestId("form-status").textContent).toContain("version 4");
    // Authors come back from the server as a list and are shown as the "A and B" text they are edited as.
    expect((within(screen.getByTestId("reference-fields-0")).getByLabelText("Authors") as HTMLInputElement).value).toBe("N. Yunes and F. Pretorius");

    fireEvent.click(screen.getByRole("button", { name: "Bring back my edits" }));
    await waitFor(() => expect(name.value).toBe("Form test dipole (my wording)"));
  });
});

describe("submission form: unsaved changes", () => {
  it("when an edit is saved, then the status says the version saved and no longer 'unsaved changes'; a new edit says it again", async () => {
    responders.push((c) => (c.method === "PATCH" && c.url === "/api/v1/submissions/7" ? { status: 200, body: { id: 7, status: "draft", version: 4, checks: checksReport } } : undefined));
    renderForm({ id: 7, version: 3, status: "draft" });
    const status = screen.getByTestId("form-status");
    expect(status.textContent).not.toContain("unsaved changes");
    const name = screen.getByLabelText("Name") as HTMLInputElement;
    fireEvent.change(name, { target: { value: "Form test dipole (reworded)" } });
    await waitFor(() => expect(status.textContent).toContain("unsaved changes"));
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));
    await waitFor(() => expect(status.textContent).toContain("Saved as version 4."));
    // Let every effect and re-render after the save settle before reading the flag.
    await new Promise((r) => setTimeout(r, 50));
    expect(status.textContent).toContain("Submission 7, version 4");
    expect(status.textContent).not.toContain("unsaved changes");
    expect(saves()[0]?.body).toMatchObject({ version: 3, theory: { name: "Form test dipole (reworded)" } });
    fireEvent.change(name, { target: { value: "Form test dipole (reworded again)" } });
    await waitFor(() => expect(status.textContent).toContain("unsaved changes"));
    // The "saved" notice described the saved form; beside an edit it would contradict "unsaved changes".
    expect(status.textContent).not.toContain("Saved as version 4.");
  });

  it("when a save is refused before sending (an empty required field), then the status says it was not saved, not the earlier save", async () => {
    responders.push((c) => (c.method === "PATCH" && c.url === "/api/v1/submissions/7" ? { status: 200, body: { id: 7, status: "draft", version: 4, checks: checksReport } } : undefined));
    renderForm({ id: 7, version: 3, status: "draft" });
    const status = screen.getByTestId("form-status");
    const name = screen.getByLabelText("Name") as HTMLInputElement;
    fireEvent.change(name, { target: { value: "Form test dipole (reworded)" } });
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));
    await waitFor(() => expect(status.textContent).toContain("Saved as version 4."));
    fireEvent.change(name, { target: { value: "" } });
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));
    await screen.findByTestId("error-summary");
    expect(status.textContent).toContain("unsaved changes");
    expect(status.textContent).toContain("Not saved: fix the problems listed at the top of the form.");
    expect(status.textContent).not.toContain("Saved as");
    expect(saves()).toHaveLength(1);
  });

  it("when a new entry is saved for the first time, then the status does not say 'unsaved changes'", async () => {
    responders.push((c) => (c.method === "POST" && c.url === "/api/v1/submissions" ? { status: 201, body: { id: 9, status: "draft", version: 1, checks: checksReport } } : undefined));
    const created: number[] = [];
    renderForm({ onCreated: (id) => created.push(id) });
    fireEvent.change(screen.getByLabelText("Name") as HTMLInputElement, { target: { value: "Form test dipole (new)" } });
    fireEvent.click(screen.getByRole("button", { name: "Save draft" }));
    const status = screen.getByTestId("form-status");
    await waitFor(() => expect(status.textContent).toContain("Saved as version 1."));
    await new Promise((r) => setTimeout(r, 50));
    expect(created).toEqual([9]);
    expect(status.textContent).not.toContain("unsaved changes");
  });
});

describe("submission form: the engine's verdict while typing", () => {
  it("when the expression has a dimension error, then the debounced check shows a failed dimension badge under it", async () => {
    const wrong = "-(5/7168)*alpha*(m1^2*s2 - m2^2*s1)^2/(M^4*eta^(18/5))";
    responders.push((c) =>
      c.method === "POST" && c.url === "/api/v1/expressions/check" && (c.body as { expression: string }).expression !== wrong
        ? { status: 200, body: { ok: true, latex: "\\beta", checks: [{ name: "dimension", ok: true, message: "expression is dimensionless" }] } }
        : undefined,
    );
    responders.push((c) =>
      c.method === "POST" && c.url === "/api/v1/expressions/check"
        ? {
            status: 200,
            body: {
              ok: false,
              latex: "-\\frac{5}{7168}\\,\\alpha",
              checks: [
                { name: "parse", ok: true, message: "expression parses" },
                { name: "dimension", ok: false, severity: "error", message: "expression has dimension length^2; the ppE phase coefficient must be dimensionless" },
              ],
            },
          }
        : undefined,
    );
    renderForm();
    // The stored expression is checked first and passes.
    await waitFor(() => expect(screen.getByTestId("live-checks-0").querySelector('[data-check="dimension"]')?.getAttribute("data-outcome")).toBe("ok"));
    const expression = screen.getByLabelText("Expression for β");
    for (const partial of ["-(5/7168)*al", "-(5/7168)*alpha*(m1^2", wrong]) fireEvent.change(expression, { target: { value: partial } });

    await waitFor(() => expect(screen.getByTestId("live-checks-0").querySelector('[data-check="dimension"]')?.getAttribute("data-outcome")).toBe("failed"));
    const dimension = screen.getByTestId("live-checks-0").querySelector('[data-check="dimension"]');
    expect(dimension?.textContent).toContain("must be dimensionless");
    const sent = calls.filter((c) => c.url === "/api/v1/expressions/check").map((c) => c.body as { expression: string });
    // Debounced: the quick partial edits were never sent; the settled text went once, with the form's context.
    expect(sent.map((b) => b.expression).filter((e) => e.startsWith("-(5/7168)*al"))).toEqual([wrong]);
    expect(sent.at(-1)).toEqual({
      expression: wrong,
      target: "ppe_phase",
      b: -7,
      pn_order: -1,
      couplings: [{ symbol: "alpha", dimension: 2 }],
      definitions: [{ symbol: "zeta", expression: "16*pi*alpha^2/M^4" }],
    });
  });

  it("when the coupling's GR value is chosen, then the live check sends it and shows the GR-limit verdict", async () => {
    responders.push((c) => {
      if (c.method !== "POST" || c.url !== "/api/v1/expressions/check") return undefined;
      const declared = (c.body as { couplings: { gr_value?: string }[] }).couplings[0]?.gr_value;
      return declared === "infinity"
        ? { status: 200, body: { ok: false, latex: "\\beta", checks: [{ name: "gr_limit", ok: false, severity: "error", message: "GR is declared at alpha -> infinity, but the expression vanishes only as alpha -> 0" }] } }
        : { status: 200, body: { ok: true, latex: "\\beta", checks: [{ name: "gr_limit", ok: true, message: "the expression vanishes when alpha = 0" }, { name: "symmetry", ok: true, message: "dipole term: it vanishes for identical bodies" }] } };
    });
    renderForm();
    await waitFor(() => expect(screen.getByTestId("live-checks-0").querySelector('[data-check="symmetry"]')?.getAttribute("data-outcome")).toBe("ok"));
    fireEvent.change(within(screen.getByTestId("coupling-fields-0")).getByLabelText("GR is at"), { target: { value: "infinity" } });
    await waitFor(() => expect(screen.getByTestId("live-checks-0").querySelector('[data-check="gr_limit"]')?.getAttribute("data-outcome")).toBe("failed"));
    const sent = calls.filter((c) => c.url === "/api/v1/expressions/check").map((c) => c.body as { couplings: unknown[] });
    expect(sent.at(-1)?.couplings).toEqual([{ symbol: "alpha", dimension: 2, gr_value: "infinity" }]);
  });

  it("when the engine refuses the expression (400 naming it), then its reason is shown inline", async () => {
    responders.push((c) =>
      c.method === "POST" && c.url === "/api/v1/expressions/check"
        ? { status: 400, body: { error: { code: "invalid_expression", message: "':=' is not allowed", fields: { expression: "':=' is not allowed in an expression" } } } }
        : undefined,
    );
    renderForm();
    fireEvent.change(screen.getByLabelText("Expression for β"), { target: { value: "f(x):=x^2" } });
    const note = await screen.findByTestId("live-check-error-0");
    expect(note.textContent).toContain("':=' is not allowed in an expression");
  });
});

describe("applyServerErrors", () => {
  it("when paths have a control, then setError gets them; others are returned to be listed", () => {
    const setError = vi.fn();
    const err = new ApiError(400, "validation_error", "bad", {
      "theory.mappings.1.validity.0.max": "must be a number",
      "theory.mappings.0.references.2": 'cites "nope", which is not the key of any reference in this entry',
      "theory.mappings.0.held_fixed.beta": '"beta" is not a coupling of this entry',
    });
    const left = applyServerErrors(err, setError);
    expect(setError.mock.calls.map((c) => c[0])).toEqual(["theory.mappings.1.validity.0.max", "theory.mappings.0.references"]);
    expect(left).toEqual([{ path: "theory.mappings.0.held_fixed.beta", message: '"beta" is not a coupling of this entry' }]);
  });

  it("when the error is not an API error with fields, then nothing is placed", () => {
    const setError = vi.fn();
    expect(applyServerErrors(new Error("network down"), setError)).toEqual([]);
    expect(applyServerErrors(new ApiError(500, "internal", "boom"), setError)).toEqual([]);
    expect(setError).not.toHaveBeenCalled();
  });

  it("when asked which paths the form renders, then entry fields are in and unshown ones are out", () => {
    expect(isRenderedPath("theory.slug")).toBe(true);
    expect(isRenderedPath("theory.references.0.arxiv")).toBe(true);
    expect(isRenderedPath("theory.couplings.0.conventions.1.factor")).toBe(false);
    expect(isRenderedPath("target_slug")).toBe(false);
  });
});
