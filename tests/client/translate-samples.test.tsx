// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen, waitFor, within } from "@testing-library/react";
import { useState } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { eventsRequestSchema, samplesRequestSchema, type EventsRequest, type SamplesRequest } from "../../common/convert-samples.ts";
import { EventsForm, EventsResult } from "../../client/features/translate/components/events-panel.tsx";
import { DEFAULT_DEVIATION, type DeviationValues } from "../../client/features/translate/components/samples-panel-fields.tsx";
import { SamplesForm, SamplesResult } from "../../client/features/translate/components/samples-panel.tsx";
import { convertEvents } from "../../server/features/convert/events.ts";
import { convertSamples } from "../../server/features/convert/samples.ts";
import { seedCatalogue } from "../api/convert-fixture.ts";

afterEach(cleanup);

const THEORIES = [{ slug: "edgb", name: "Einstein-dilaton-Gauss-Bonnet gravity" }];

/** The forms are controlled for their deviation fields; this host keeps that state as the panels do. */
function Host({ kind, onSubmit, serverFields = {} }: { kind: "samples" | "events"; onSubmit: (r: SamplesRequest | EventsRequest) => void; serverFields?: Record<string, string> }) {
  const [deviation, setDeviation] = useState<DeviationValues>(DEFAULT_DEVIATION);
  const props = { theories: THEORIES, theoriesLoading: false, deviation, onDeviation: setDeviation, busy: false, serverFields };
  return kind === "samples" ? <SamplesForm {...props} onSubmit={onSubmit} /> : <EventsForm {...props} onSubmit={onSubmit} />;
}

describe("<SamplesForm>", () => {
  it("when the example posterior is sent for EdGB, then the request carries every column, row by row", async () => {
    const onSubmit = vi.fn();
    render(<Host kind="samples" onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("samples-theory"), { target: { value: "edgb" } });
    fireEvent.click(screen.getByTestId("run-samples"));
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    const request = onSubmit.mock.calls[0]![0] as SamplesRequest;
    expect(request).toMatchObject({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", bodies: ["bh", "bh"] });
    expect(request.columns.beta).toEqual([-8.1e-4, 3.2e-4, -1.1e-3, 6.0e-4, -2.4e-4]);
    expect(request.columns.m2[2]).toBe(5.3);
    expect(request.columns.chi2?.[1]).toBe(0.1);
  });

  it("when a pasted cell is not a number, then the problem names the column, the row and the CSV line, and nothing is sent", async () => {
    const onSubmit = vi.fn();
    render(<Host kind="samples" onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("samples-theory"), { target: { value: "edgb" } });
    fireEvent.change(screen.getByTestId("samples-csv"), { target: { value: "beta,m1,m2\n1e-3,10,5\n1e-3,ten,5\n" } });
    fireEvent.click(screen.getByTestId("run-samples"));
    const problems = await screen.findByTestId("samples-problems");
    expect(problems.textContent).toMatch(/column m1, row 1: "ten" is not a finite number \(CSV line 3\)/);
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("when no theory is chosen, then the theory field says why", async () => {
    const onSubmit = vi.fn();
    render(<Host kind="samples" onSubmit={onSubmit} />);
    fireEvent.click(screen.getByTestId("run-samples"));
    await waitFor(() => expect(screen.getByLabelText("Theory to constrain").getAttribute("aria-invalid")).toBe("true"));
    expect(onSubmit).not.toHaveBeenCalled();
  });
});

describe("<SamplesResult>", () => {
  it("when half the samples fail EdGB's condition, then the bound, the count, the 50% pass rate, the prior caution and the histogram are shown", async () => {
    const n = 200;
    const data = await convertSamples(
      seedCatalogue(),
      samplesRequestSchema.parse({ theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9, frame: "source", columns: { beta: Array.from({ length: n }, (_, i) => (i < n / 2 ? 1e-3 : 1e-7)), m1: Array(n).fill(10), m2: Array(n).fill(5) } }),
    );
    render(<SamplesResult data={data} />);
    // The 0.9 quantile of the samples is the 1e-3 half: 4.07 km, the /convert limit for 10 + 5 Msun (tests/api/convert-post.test.ts).
    expect(screen.getByTestId("samples-bound").textContent).toMatch(/√α\s*≤\s*4\.07\s*km/);
    expect(screen.getByTestId("samples-count").textContent).toMatch(/200 of 200 samples translated/);
    expect(within(screen.getByTestId("samples-validity")).getAllByText("50%").length).toBeGreaterThan(0);
    const cautions = screen.getByTestId("samples-cautions");
    expect([...cautions.querySelectorAll("li")].map((li) => li.getAttribute("data-caution"))).toEqual(expect.arrayContaining(["validity", "prior", "leading_pn"]));
    const figure = screen.getByTestId("samples-histogram");
    // The plotting library is loaded on demand: give the import time on a loaded machine.
    await waitFor(() => expect(figure.querySelector("svg")).not.toBeNull(), { timeout: 15_000 });
    // Two occupied bins (1e-7 and 1e-3 give two sqrt(alpha) values a factor 10 apart), among the 40 drawn.
    expect(figure.querySelectorAll("svg rect").length).toBeGreaterThanOrEqual(2);
    // The downloaded SVG carries the title in symbols, the bound's legend, and the failing condition and cautions, each marked.
    const files: Blob[] = [];
    const created = vi.fn((b: Blob) => {
      files.push(b);
      return "blob:figure";
    });
    Object.assign(URL, { createObjectURL: created, revokeObjectURL: vi.fn() });
    const click = vi.spyOn(HTMLAnchorElement.prototype, "click").mockImplementation(() => undefined);
    fireEvent.click(screen.getByTestId("samples-histogram-svg"));
    click.mockRestore();
    expect(files).toHaveLength(1);
    const svg = await files[0]!.text();
    expect(svg).toMatch(/data-role="figure-title"[^>]*>[^<]*√α per sample/);
    expect(svg).toMatch(/data-role="figure-legend"[^>]*><tspan[^>]*>│<\/tspan><tspan[^>]*>the 90% upper bound/);
    expect(svg).toMatch(/data-role="figure-caution"[^>]*><tspan[^>]*>⚠<\/tspan>/);
    const cautionText = [...svg.matchAll(/data-role="figure-caution"[^>]*>(.*?)<\/text>/g)].map((m) => m[1]!.replace(/<[^>]+>/g, " ")).join(" ").replace(/\s+/g, " ");
    expect(cautionText).toMatch(/⚠ [^⚠]*fails for 50% of the 200 samples checked/);
    // One namespace declaration on the root: a strict XML reader refuses a repeated attribute.
    expect(svg.match(/^<\?xml[^>]*>\s*<svg[^>]*>/)![0].match(/ xmlns="/g)).toHaveLength(1);
    expect(svg).not.toContain("sqrt_alpha");
  });
});

describe("<EventsForm>", () => {
  it("when an event is edited and sent, then the request holds every event with its binary and bound", () => {
    const onSubmit = vi.fn();
    render(<Host kind="events" onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("events-theory"), { target: { value: "edgb" } });
    fireEvent.change(screen.getByTestId("event-1-upper"), { target: { value: "5e-4" } });
    fireEvent.click(screen.getByTestId("run-events"));
    const request = onSubmit.mock.calls[0]![0] as EventsRequest;
    expect(eventsRequestSchema.parse(request)).toEqual(request);
    expect(request.events).toHaveLength(3);
    expect(request.events[1]).toMatchObject({ label: "KV-240322c", upper: 5e-4, binary: { m1: 35, m2: 9, chi1: 0.2, frame: "source", z: 0.3 } });
    expect(request.events[2]!.binary.bodies).toEqual(["bh", "ns"]);
  });

  it("when events state their bounds as a signed interval and as one-sided ends, then each is sent in that form (the API's signed intervals per event)", () => {
    const onSubmit = vi.fn();
    render(<Host kind="events" onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("events-theory"), { target: { value: "edgb" } });
    fireEvent.change(screen.getByTestId("event-0-shape"), { target: { value: "interval" } });
    fireEvent.change(screen.getByTestId("event-0-lo"), { target: { value: "-3e-5" } });
    fireEvent.change(screen.getByTestId("event-0-hi"), { target: { value: "1e-5" } });
    fireEvent.change(screen.getByTestId("event-1-shape"), { target: { value: "lower_only" } });
    fireEvent.change(screen.getByTestId("event-1-lo"), { target: { value: "-2e-5" } });
    fireEvent.change(screen.getByTestId("event-2-shape"), { target: { value: "upper_only" } });
    fireEvent.change(screen.getByTestId("event-2-hi"), { target: { value: "4e-5" } });
    fireEvent.click(screen.getByTestId("run-events"));
    const request = onSubmit.mock.calls[0]![0] as EventsRequest;
    expect(eventsRequestSchema.parse(request)).toEqual(request);
    expect(request.events[0]).toMatchObject({ interval: [-3e-5, 1e-5] });
    expect(request.events[0]).not.toHaveProperty("upper");
    expect(request.events[1]).toMatchObject({ interval: [-2e-5, null] });
    expect(request.events[2]).toMatchObject({ interval: [null, 4e-5] });
  });

  it("when an event's mass is not positive, then the problem names the event and the field, and nothing is sent", () => {
    const onSubmit = vi.fn();
    render(<Host kind="events" onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("events-theory"), { target: { value: "edgb" } });
    fireEvent.change(screen.getByTestId("event-0-m1"), { target: { value: "-2" } });
    fireEvent.click(screen.getByTestId("run-events"));
    expect(screen.getByTestId("events-problems").textContent).toMatch(/KV-231107a, m1: m1 must be positive/);
    expect(screen.getByTestId("event-0-m1").getAttribute("aria-invalid")).toBe("true");
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("when an event is added and one removed, then the table follows", () => {
    render(<Host kind="events" onSubmit={vi.fn()} />);
    fireEvent.click(screen.getByTestId("add-event"));
    expect(screen.getAllByRole("button", { name: /Remove event/ })).toHaveLength(4);
    fireEvent.click(screen.getByRole("button", { name: "Remove event 1" }));
    expect((screen.getByTestId("event-0-label") as HTMLInputElement).value).toBe("KV-240322c");
  });
});

describe("<EventsResult>", () => {
  it("when three events are translated, then each row has its limit, the tightest is marked and the combined row is labelled as a Gaussian approximation", () => {
    const data = convertEvents(
      seedCatalogue(),
      eventsRequestSchema.parse({
        theory: "edgb", parameter: "ppe_beta", b: -7, credibility: 0.9,
        events: [
          { label: "KV-231107a", binary: { m1: 10, m2: 5, frame: "source" }, upper: 1e-5 },
          { label: "KV-240322c", binary: { m1: 35, m2: 9, frame: "source" }, upper: 4e-6 },
          { label: "KV-x", binary: { m1: 8, m2: 8, frame: "source" }, upper: 1e-5 },
        ],
      }),
    );
    render(<EventsResult data={data} />);
    // 4.07 km at |beta| <= 1e-3 scales as beta^(1/4) (EdGB, p = 2 in alpha): 4.07 x 0.01^(1/4) = 1.29 km (derived).
    expect(screen.getByTestId("events-row-0").textContent).toMatch(/≤\s*1\.29\s*km/);
    expect(screen.getByTestId("events-row-2").textContent).toMatch(/—/);
    const tightest = data.tightest!.label;
    const index = data.events.findIndex((e) => e.label === tightest);
    expect(screen.getByTestId(`events-row-${index}`).textContent).toMatch(/tightest/);
    const combined = screen.getByTestId("events-combined");
    expect(combined.textContent).toMatch(/Combined \(2 events\)/);
    expect(combined.textContent).toMatch(/Gaussian approximation/);
    expect(screen.getByTestId("events-cautions").textContent).toMatch(/left out of the combination/);
  });
});
