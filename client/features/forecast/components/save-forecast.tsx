import { useState } from "react";
import { Link } from "react-router-dom";
import type { ForecastResponse } from "../../../../common/forecasts.ts";
import { MAX_SHEET_RECORDS, sheetRecordInputSchema, type SheetRecordFormInput } from "../../../../common/sheets.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { paths } from "../../../lib/paths.ts";
import { useAuth } from "../../auth/components/auth-context.tsx";
import { useCreateSheet } from "../../sheets/api/create-sheet.ts";
import { networkName } from "./forecast-plots.tsx";

/**
 * One sheet record per network and b with a bound: the bound is stored as a ppE bound like any other,
 * with "forecast" written in its provenance, so the sheet's CSV and LaTeX exports carry it.
 */
export function forecastRecords(result: ForecastResponse): SheetRecordFormInput[] {
  const p = result.priors;
  const prior = (v: number | null) => (v === null ? "none" : Number(v.toPrecision(4)).toString());
  const records: SheetRecordFormInput[] = [];
  result.networks.forEach((n, i) => {
    const name = networkName(result, i);
    for (const row of n.rows) {
      if (row.bound === null) continue;
      records.push({
        label: `Forecast: ${name}, b = ${row.b}`.slice(0, 120),
        detector_network: name.slice(0, 120),
        analysis_method: `Fisher-matrix forecast, restricted TaylorF2 3.5PN aligned spins, ${result.sides}-sided`.slice(0, 200),
        notes: [
          "A forecast, not a measurement.",
          `Network SNR ${n.snr.total.toPrecision(3)}${n.snr.total < 10 ? " (below 10: a Fisher estimate is not trustworthy)" : ""}.`,
          `Priors: phi_c ${prior(p.phi_c)}, chi_s ${prior(p.chi_s)}, chi_a ${prior(p.chi_a)}.`,
          `Bands: ${result.detectors.filter((d) => n.detectors.includes(d.index)).map((d) => `${d.label} ${Number(d.f_low.toPrecision(3))}-${Number(d.f_high.toPrecision(3))} Hz`).join("; ")}.`,
          `sigma_beta = ${row.sigma_beta?.toPrecision(4)}, condition number ${row.condition_number?.toExponential(1) ?? "n/a"}${row.status === "ill_conditioned" ? " (ill-conditioned)" : ""}.`,
        ].join(" "),
        bound: { parameter: "ppe_beta", b: row.b, upper: row.bound, credibility: result.credibility },
        binary: { m1: result.source.m1, m2: result.source.m2, chi1: result.source.chi1, chi2: result.source.chi2, frame: "source", z: result.source.z },
        cosmology: result.cosmology,
      });
    }
  });
  return records;
}

export function SaveForecast({ result }: { result: ForecastResponse }) {
  const { user, hasRole } = useAuth();
  const create = useCreateSheet();
  const [name, setName] = useState("Forecast");
  const records = forecastRecords(result);
  if (!hasRole("analyst")) {
    return (
      <p className="text-sm text-ink-faint">
        {user ? "Saving forecasts to sheets needs the analyst role." : <>Sign in with the analyst role to save this forecast to a sheet (<Link to={paths.signIn({ returnTo: paths.forecast() })}>sign in</Link>).</>}
      </p>
    );
  }
  const tooMany = records.length > MAX_SHEET_RECORDS;
  return (
    <section className="flex flex-col gap-2 rounded border border-sea/30 bg-sea-wash/40 p-3" data-testid="save-forecast">
      <h3 className="text-lg">Save to a sheet</h3>
      <p className="text-sm text-ink-soft">
        {records.length} bound{records.length === 1 ? "" : "s"} (one per network and b), each translated again on saving and marked as a forecast; the sheet exports them as CSV or LaTeX.
        {tooMany && ` A sheet holds at most ${MAX_SHEET_RECORDS}: ask for fewer networks or values of b.`}
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <Field label="Sheet name">{(c) => <TextInput {...c} value={name} onChange={(e) => setName(e.target.value)} maxLength={200} />}</Field>
        <Button kind="primary" busy={create.isPending} disabled={tooMany || records.length === 0 || name.trim() === ""} onClick={() => create.mutate({ name: name.trim(), description: "Fisher-matrix forecast", records: records.map((r) => sheetRecordInputSchema.parse(r)) })}>
          Save as a new sheet
        </Button>
      </div>
      {create.error && <ErrorNote error={create.error} title="The sheet was not saved." />}
      {create.data && (
        <p className="text-sm" role="status">
          Saved: <Link to={paths.sheet(create.data.id)}>{create.data.name}</Link>.
        </p>
      )}
    </section>
  );
}
