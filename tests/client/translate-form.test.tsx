// @vitest-environment jsdom
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { ConvertRequest } from "../../common/convert.ts";
import { BoundForm } from "../../client/features/translate/components/bound-form.tsx";
import { ApiError } from "../../client/lib/api-client.ts";
import { formInitial, readRequestParam, requestParam } from "../../client/features/translate/lib/request-url.ts";
import { PLANCK_2018 } from "../../server/physics/cosmology.ts";

afterEach(cleanup);

const submit = () => fireEvent.click(screen.getByRole("button", { name: "Translate the bound" }));
const field = (label: string) => screen.getByLabelText(label) as HTMLInputElement;

describe("<BoundForm>", () => {
  it("when the worked example is submitted, then the request is the shared schema's output with the Planck 2018 cosmology", async () => {
    const onSubmit = vi.fn<(r: ConvertRequest) => void>();
    render(<BoundForm onSubmit={onSubmit} />);
    expect(field("H₀ (km/s/Mpc)").value).toBe("67.66");
    expect(field("Ωₘ (flat)").value).toBe("0.3111");
    submit();
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]![0]).toEqual({
      bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, sign_convention: "plus", f_low: 20 },
      binary: { m1: 10, m2: 5, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" },
      cosmology: { H0: 67.66, Omega_m: 0.3111 },
    });
  });

  it("when a mass is negative or a spin reaches 1, then the schema's message sits under that field and nothing is sent", async () => {
    const onSubmit = vi.fn();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(field("m₂ (M☉)"), { target: { value: "-5" } });
    fireEvent.change(field("χ₁ (aligned)"), { target: { value: "1" } });
    submit();
    await screen.findByText("m2 must be positive (solar masses)");
    expect(screen.getByText("|chi1| must be below 1")).toBeTruthy();
    expect(field("m₂ (M☉)").getAttribute("aria-invalid")).toBe("true");
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("when detector-frame masses have no redshift, then z is the field at fault", async () => {
    const onSubmit = vi.fn();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText("Masses are"), { target: { value: "detector" } });
    submit();
    await screen.findByText("detector-frame masses need the redshift z");
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("when gIMR is chosen, then k replaces b, and the log term is sent as text", async () => {
    const onSubmit = vi.fn<(r: ConvertRequest) => void>();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText("Deviation parameter"), { target: { value: "gimr_dphi" } });
    const k = await screen.findByLabelText("Index k");
    expect(screen.queryByLabelText("Exponent b")).toBeNull();
    fireEvent.change(k, { target: { value: "5l" } });
    submit();
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]![0].bound).toEqual({ parameter: "gimr_dphi", k: "5l", upper: 1e-3, credibility: 0.9, f_low: 20, includes_spin: false });
  });

  it("when the bound is stated as an interval, then [lo, hi] is sent and upper is not", async () => {
    const onSubmit = vi.fn<(r: ConvertRequest) => void>();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("bound-shape"), { target: { value: "interval" } });
    fireEvent.change(await screen.findByLabelText("Lower end lo of β"), { target: { value: "-2e-3" } });
    fireEvent.change(screen.getByLabelText("Upper end hi of β"), { target: { value: "5e-4" } });
    submit();
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]![0].bound).toEqual({ parameter: "ppe_beta", b: -7, interval: [-2e-3, 5e-4], credibility: 0.9, sign_convention: "plus", f_low: 20 });
  });

  it("when the bound is one-sided, then the open end is sent as null", async () => {
    const onSubmit = vi.fn<(r: ConvertRequest) => void>();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("bound-shape"), { target: { value: "lower_only" } });
    expect(screen.queryByLabelText("Upper end hi of β")).toBeNull();
    fireEvent.change(await screen.findByLabelText("Lower end lo of β"), { target: { value: "-3e-3" } });
    submit();
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]![0].bound).toMatchObject({ interval: [-3e-3, null] });
    expect(onSubmit.mock.calls[0]![0].bound).not.toHaveProperty("upper");
  });

  it("when an interval excludes zero, then the form says GR is outside it and sends nothing", async () => {
    const onSubmit = vi.fn();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByTestId("bound-shape"), { target: { value: "interval" } });
    fireEvent.change(await screen.findByLabelText("Lower end lo of β"), { target: { value: "1e-3" } });
    fireEvent.change(screen.getByLabelText("Upper end hi of β"), { target: { value: "2e-3" } });
    submit();
    await screen.findByText(/GR itself is outside the interval/);
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it("when the server names fields, then its messages land on those fields and the rest are listed", async () => {
    const error = new ApiError(400, "validation_failed", "Invalid binary.m2: nope", { "binary.m2": "m2 refused by the server", "conventions.edgb": 'unknown convention "XYZ"' });
    render(<BoundForm onSubmit={() => undefined} serverError={error} />);
    await screen.findByText("m2 refused by the server");
    expect(field("m₂ (M☉)").getAttribute("aria-invalid")).toBe("true");
    expect(screen.getByText('conventions.edgb: unknown convention "XYZ"')).toBeTruthy();
  });

  it("when the ppE amplitude is chosen, then a replaces b, there is no phase convention, and the bound is a ppe_alpha bound", async () => {
    const onSubmit = vi.fn<(r: ConvertRequest) => void>();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText("Deviation parameter"), { target: { value: "ppe_alpha" } });
    const a = await screen.findByLabelText("Exponent a");
    expect(screen.queryByLabelText("Exponent b")).toBeNull();
    expect(screen.queryByLabelText("Phase sign convention of the analysis")).toBeNull();
    fireEvent.change(a, { target: { value: "3" } });
    fireEvent.change(field("Upper bound on |α|"), { target: { value: "0.05" } });
    submit();
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]![0].bound).toEqual({ parameter: "ppe_alpha", a: 3, upper: 0.05, credibility: 0.9, f_low: 20 });
  });

  it("when a distance ratio is chosen, then it is an interval around 1 at the source's redshift, and a ratio leaving out 1 is refused beside its field", async () => {
    const onSubmit = vi.fn<(r: ConvertRequest) => void>();
    render(<BoundForm onSubmit={onSubmit} />);
    fireEvent.change(screen.getByLabelText("Deviation parameter"), { target: { value: "distance_ratio" } });
    const z = await screen.findByLabelText("Source redshift z");
    expect((screen.getByTestId("bound-shape") as HTMLSelectElement).value).toBe("interval");
    fireEvent.change(z, { target: { value: "0.3" } });
    fireEvent.change(field("Lower end lo of d_L^GW/d_L^EM"), { target: { value: "1.1" } });
    fireEvent.change(field("Upper end hi of d_L^GW/d_L^EM"), { target: { value: "1.3" } });
    submit();
    await screen.findByText(/GR itself \(d_L\^GW \/ d_L\^EM = 1\) is outside/);
    expect(onSubmit).not.toHaveBeenCalled();
    fireEvent.change(field("Lower end lo of d_L^GW/d_L^EM"), { target: { value: "0.8" } });
    submit();
    await waitFor(() => expect(onSubmit).toHaveBeenCalledTimes(1));
    expect(onSubmit.mock.calls[0]![0].bound).toEqual({ parameter: "distance_ratio", interval: [0.8, 1.3], z: 0.3, credibility: 0.9, f_low: 20 });
  });
});

describe("the translate page's address and the default cosmology", () => {
  const withoutCosmology: ConvertRequest = {
    bound: { parameter: "ppe_beta", b: -7, upper: 1e-3, credibility: 0.9, sign_convention: "plus", f_low: 20 },
    binary: { m1: 10, m2: 5, chi1: 0, chi2: 0, bodies: ["bh", "bh"], frame: "source" },
  };

  it("when a link carries no cosmology, then the form shows the server's default (Planck 2018, as the API assumes) instead of empty fields", () => {
    const read = readRequestParam(JSON.stringify(withoutCosmology));
    expect(read.kind).toBe("ok");
    if (read.kind !== "ok") return;
    expect(read.request.cosmology).toBeUndefined();
    render(<BoundForm onSubmit={vi.fn()} initial={formInitial(read.request)} />);
    // The server's default: server/physics/cosmology.ts takes it from common/convert.ts.
    expect(field("H₀ (km/s/Mpc)").value).toBe(String(PLANCK_2018.H0));
    expect(field("Ωₘ (flat)").value).toBe(String(PLANCK_2018.Omega_m));
  });

  it("when the cosmology is the default, then the address leaves it out; another cosmology stays in", () => {
    expect(JSON.parse(requestParam({ ...withoutCosmology, cosmology: { H0: 67.66, Omega_m: 0.3111 } }))).toEqual(withoutCosmology);
    expect(JSON.parse(requestParam({ ...withoutCosmology, cosmology: { H0: 70, Omega_m: 0.3111 } })).cosmology).toEqual({ H0: 70, Omega_m: 0.3111 });
    const other = readRequestParam(requestParam({ ...withoutCosmology, cosmology: { H0: 70, Omega_m: 0.3 } }));
    expect(other.kind === "ok" && formInitial(other.request).cosmology).toEqual({ H0: 70, Omega_m: 0.3 });
  });
});
