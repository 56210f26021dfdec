// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { convertRequestSchema, type ConvertResponse } from "../../common/convert.ts";
import { BetaPlot } from "../../client/features/translate/components/beta-plot.tsx";
import { MARK_STYLE, plotName, theoryLabels } from "../../client/components/ui/theory-labels.ts";
import { comparableQuantity, CouplingPlot } from "../../client/features/translate/components/coupling-plot.tsx";
import { NotApplicableList } from "../../client/features/translate/components/not-applicable-list.tsx";
import { ResultsTable } from "../../client/features/translate/components/results-table.tsx";
import { decadeLabel, formatPlain, splitScientific, unitText } from "../../client/features/translate/components/sci-number.tsx";
import { TableOverB } from "../../client/features/translate/components/table-over-b.tsx";
import { parseBoundsCsv } from "../../client/features/translate/lib/parse-bounds-csv.ts";
import { figureSvg, wrapText } from "../../client/lib/figure-svg.ts";
import { serializeSvg } from "../../client/lib/plot.ts";
import { translate } from "../../server/features/convert/translate.ts";
import { seedCatalogue } from "../api/convert-fixture.ts";

afterEach(cleanup);

/** A real answer from the translator over the seeded catalogue (no server round trip needed). */
function answer(body: unknown): ConvertResponse {
  return translate(seedCatalogue(), convertRequestSchema.parse(body));
}
const dipole = () => answer({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
const graviton = () => answer({ bound: { parameter: "ppe_beta", b: -3, upper: 0.02, credibility: 0.9 }, binary: { m1: 30, m2: 25, frame: "source", z: 0.2 } });

describe("number formatting", () => {
  it("when numbers are shown, then three figures, scientific outside [1e-3, 1e4), and decades as powers of ten", () => {
    expect(splitScientific(4.0721)).toEqual({ mantissa: "4.07", exponent: null });
    expect(splitScientific(1.27e-23)).toEqual({ mantissa: "1.27", exponent: -23 });
    expect(formatPlain(2.5e13)).toBe("2.50×10¹³");
    expect(decadeLabel(1e-3)).toBe("10⁻³");
    expect(decadeLabel(2e-3)).toBe("");
    expect(unitText("km^2")).toBe("km²");
    expect(unitText("1/yr")).toBe("yr⁻¹");
    expect(unitText("1")).toBe("");
  });
});

describe("<ResultsTable>", () => {
  it("when EdGB fails its validity at the limit, then the row shows the limit, the failing condition with its number, the comparison and the cautions", async () => {
    const r = dipole();
    render(<ResultsTable results={r.results} onConvention={() => undefined} />);
    const row = screen.getByTestId("result-edgb");
    expect(within(row).getByTestId("limit-edgb").textContent).toMatch(/≤\s*4\.07\s*km/);
    const validity = within(row).getByTestId("validity-edgb").textContent ?? "";
    expect(validity).toMatch(/outside validity/);
    expect(within(row).getByTestId("validity-edgb").getAttribute("data-verdict")).toBe("outside_validity");
    // The failing condition with the factor it fails by: 4.65 / (1/6) = 27.9.
    expect(validity).toMatch(/fails ×27\.9: .*body 2.*4\.65 > 1\/6/);
    // No comparison for a limit outside validity.
    expect(within(row).getByTestId("comparison-edgb").textContent).toMatch(/^not compared with/);
    const cautions = within(row).getByTestId("cautions-edgb");
    expect([...cautions.querySelectorAll("li")].map((li) => li.getAttribute("data-caution"))).toEqual(["validity", "validity", "leading_pn", "prior", "one_signed"]);
    // KaTeX arrives lazily; the closed form is then rendered, not shown as source.
    await waitFor(() => expect(row.querySelector(".katex")).not.toBeNull());
  });

  it("when another convention is picked, then the table asks for it by theory", () => {
    const onConvention = vi.fn();
    render(<ResultsTable results={dipole().results} onConvention={onConvention} />);
    fireEvent.change(screen.getByLabelText(/Convention for Einstein-dilaton/), { target: { value: "JB" } });
    expect(onConvention).toHaveBeenCalledWith("edgb", "JB");
  });

  it("when a massive graviton limit is shown, then m_g in eV is quoted beside lambda_g", () => {
    render(<ResultsTable results={graviton().results} onConvention={() => undefined} />);
    expect(screen.getByTestId("also-massive-graviton-m_g").textContent).toMatch(/≤.*eV/);
  });
});

describe("<NotApplicableList>", () => {
  it("when theories are not constrained, then each is listed with its b and reason", () => {
    render(<NotApplicableList items={dipole().not_applicable} />);
    const item = screen.getByTestId("not-applicable").querySelector('[data-theory="dcs"]');
    expect(item?.textContent).toMatch(/Chern-Simons.*b = -1.*not at b = -7/);
  });
});

describe("plots", () => {
  it("when theories share a b, then each keeps its own label, its verdict mark first, constrained before unconstrained, offset so none overprint", () => {
    const labels = theoryLabels([
      { b: -7, theory: "edgb", name: "EdGB", state: "outside_validity" },
      { b: -1, theory: "dcs", name: "dCS", state: "not_constrained" },
      { b: -7, theory: "brans-dicke", name: "Brans-Dicke theory", state: "valid" },
      // The same theory met again at the same b by an unconstraining row keeps its verdict.
      { b: -7, theory: "edgb", name: "EdGB", state: "not_constrained" },
    ]);
    expect(labels.map(({ b, text, state }) => ({ b, text, state }))).toEqual([
      { b: -7, text: "✓ Brans-Dicke theory", state: "valid" },
      { b: -7, text: "✕ EdGB", state: "outside_validity" },
      { b: -1, text: "– dCS", state: "not_constrained" },
    ]);
    expect(labels[1]?.title).toBe("EdGB: outside validity: a validity condition of the mapping fails at this limit");
  });

  it("when a theory's name is long, then it is cut at a word, keeping what tells entries apart", () => {
    expect(plotName("Johannsen-Psaltis parameterized black-hole spacetime")).toBe("Johannsen-Psaltis parameterized…");
    expect(plotName("EdGB")).toBe("EdGB");
    expect(plotName("Modified dispersion relation, α = 3.5")).toBe("Modified dispersion, α = 3.5");
  });

  it("when the beta plot is drawn, then it is an SVG with one dot per bound and a named, marked label per theory; the downloaded figure keeps title, marks and legend", async () => {
    render(
      <BetaPlot
        points={[
          { b: -7, beta_max: 1e-3, label: "a" },
          { b: -3, beta_max: 2e-2, label: "b" },
        ]}
        theories={[
          { b: -7, theory: "edgb", name: "EdGB", state: "outside_validity" },
          { b: -3, theory: "massive-graviton", name: "Massive graviton", state: "not_assessed" },
          { b: -1, theory: "dcs", name: "dCS", state: "not_constrained" },
        ]}
      />,
    );
    const figure = screen.getByTestId("beta-plot");
    // The plotting library is loaded on demand: give the import time on a loaded machine.
    await waitFor(() => expect(figure.querySelector("svg")).not.toBeNull(), { timeout: 15_000 });
    const svg = figure.querySelector("svg")!;
    expect(svg.querySelectorAll("circle")).toHaveLength(2);
    expect(svg.textContent).toContain("✕ EdGB");
    expect(svg.textContent).toContain("? Massive graviton");
    expect(svg.textContent).not.toMatch(/massive-graviton|edgb/);
    // The page's legend names every state drawn, in words.
    expect(screen.getByTestId("beta-plot-legend").textContent).toMatch(/outside validity.*validity not assessed.*not constrained by this bound/);
    const file = serializeSvg(figureSvg(svg, { title: "Bound on |β|", legend: [MARK_STYLE.outside_validity], caption: "A caption." }));
    expect(file.startsWith("<?xml")).toBe(true);
    expect(file).toContain('xmlns="http://www.w3.org/2000/svg"');
    expect(file).toContain("<title>Bound on |β|</title>");
    expect(file).toMatch(/data-role="figure-legend"[^>]*><tspan fill="#8f3a2c"[^>]*>✕<\/tspan><tspan[^>]*>outside validity/);
    expect(file).toContain("A caption.");
    expect(screen.getByTestId("beta-plot-svg").hasAttribute("disabled")).toBe(false);
    expect(screen.getByTestId("beta-plot-png").hasAttribute("disabled")).toBe(false);
  });

  it("when a long caption is wrapped for the downloaded figure, then no line is longer than asked and no word is lost", () => {
    const text = "Points: the bounds given (gIMR bounds converted to β for this binary). Vertical lines: where each catalogued theory enters.";
    const lines = wrapText(text, 40);
    expect(lines.every((l) => l.length <= 40)).toBe(true);
    expect(lines.join(" ")).toBe(text);
  });

  it("when the massive graviton is plotted, then the comparison is drawn in m_g, the quantity the published bounds use", async () => {
    const mg = graviton().results[0]!;
    expect(comparableQuantity(mg)?.quantity.symbol).toBe("m_g");
    render(<CouplingPlot result={mg} />);
    const figure = screen.getByTestId("coupling-plot-massive-graviton");
    // The plotting library is loaded on demand: give the import time on a loaded machine.
    await waitFor(() => expect(figure.querySelector("svg")).not.toBeNull(), { timeout: 15_000 });
    expect(figure.textContent).toMatch(/◆ LIGO-Virgo 2016/);
    // Ours a circle, the published ones diamonds: told apart by shape as well as colour.
    expect(figure.querySelectorAll("svg circle")).toHaveLength(1);
    expect(figure.querySelector("svg")!.textContent).toContain("✓ this translation");
    expect(figure.querySelector("svg")!.textContent).toContain("m_g (eV) →");
  });
});

describe("the table over b", () => {
  it("when CSV is parsed, then numbers become numbers and text stays text for the schema to judge", async () => {
    const parsed = await parseBoundsCsv("b,upper,label\n-7,1e-3,dipole\n-3,lots,\n");
    expect(parsed.problems).toEqual([]);
    expect(parsed.rows).toEqual([{ b: -7, upper: 1e-3, label: "dipole" }, { b: -3, upper: "lots" }]);
    expect((await parseBoundsCsv("x,y\n1,2\n")).problems[0]).toMatch(/b \(or k\) and upper/);
    // Signed intervals from lo and hi columns; an empty cell leaves that side open.
    expect((await parseBoundsCsv("b,lo,hi\n-7,-2e-3,1e-3\n-7,-5e-4,\n")).rows).toEqual([
      { b: -7, interval: [-2e-3, 1e-3] },
      { b: -7, interval: [-5e-4, null] },
    ]);
  });

  it("when a cell is bad, then the CSV line is named and nothing is sent; when good, the request carries the form's binary", async () => {
    const base = convertRequestSchema.parse({ bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9 }, binary: { m1: 10, m2: 5, frame: "source" } });
    const onRequest = vi.fn();
    render(<TableOverB base={base} onRequest={onRequest} data={undefined} error={null} busy={false} />);
    fireEvent.change(screen.getByTestId("csv-input"), { target: { value: "b,upper\n-7,1e-3\n-3,-2\n" } });
    fireEvent.click(screen.getByTestId("run-table"));
    await screen.findByText(/line 3, upper: upper must be positive/);
    expect(onRequest).not.toHaveBeenCalled();
    fireEvent.change(screen.getByTestId("csv-input"), { target: { value: "k,upper\n-2,0.05\n" } });
    fireEvent.click(screen.getByTestId("run-table"));
    await waitFor(() => expect(onRequest).toHaveBeenCalledTimes(1));
    expect(onRequest.mock.calls[0]![0]).toMatchObject({ rows: [{ k: -2, upper: 0.05 }], binary: base.binary, credibility: 0.9 });
  });
});
