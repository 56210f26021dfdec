import { useState } from "react";
import type { ForecastResponse } from "../../../../common/forecasts.ts";
import { Field, Select } from "../../../components/ui/field.tsx";
import { SciNumber } from "../../translate/components/sci-number.tsx";
import { NETWORK_COLOURS, networkName } from "./forecast-plots.tsx";

/**
 * A grid of binaries side by side: one row per binary, one column per network, the bound on |β| at
 * one b (chosen here), with the network SNR under it. The plots and tables above show the binary
 * chosen on the page (the first by default).
 */
export function ForecastGrid({ forecasts }: { forecasts: ForecastResponse[] }) {
  const first = forecasts[0]!;
  const bs = first.networks[0]?.rows.map((r) => r.b) ?? [];
  const [b, setB] = useState(() => (bs.includes(-7) ? -7 : (bs[0] ?? 0)));
  const bi = Math.max(0, bs.indexOf(b));
  return (
    <section className="flex flex-col gap-3" data-testid="forecast-grid">
      <h2 className="text-2xl">Binaries side by side</h2>
      <div className="flex flex-wrap items-end gap-3">
        <Field label="At b">
          {(c) => (
            <Select {...c} value={String(b)} onChange={(e) => setB(Number(e.target.value))} data-testid="forecast-grid-b">
              {bs.map((x) => (
                <option key={x} value={x}>
                  {x}
                </option>
              ))}
            </Select>
          )}
        </Field>
        <p className="text-sm text-ink-soft">Forecast {Math.round(first.credibility * 100)} % bound on |β| per binary and network; the plots and tables above show the binary chosen above them.</p>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-paper-edge text-left">
              <th className="py-1 pr-3">binary (source frame)</th>
              {first.networks.map((_, ni) => (
                <th key={ni} className="py-1 pr-3" style={{ color: NETWORK_COLOURS[ni] }}>
                  {networkName(first, ni)}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {forecasts.map((f, fi) => (
              <tr key={fi} className="border-b border-paper-edge/60 align-top">
                <th className="py-1 pr-3 text-left font-normal tabular-nums">
                  {Number(f.source.m1.toPrecision(4))} + {Number(f.source.m2.toPrecision(4))} M☉
                  <div className="text-xs text-ink-faint">ISCO {Number(f.source.f_isco_hz.toPrecision(3))} Hz</div>
                </th>
                {f.networks.map((n, ni) => {
                  const row = n.rows[bi];
                  return (
                    <td key={ni} className="py-1 pr-3" data-testid={`forecast-grid-cell-${fi}-${ni}`}>
                      {row?.bound != null ? <SciNumber value={row.bound} /> : <span className="text-ink-faint">{row?.status === "no_constraint" ? "no constraint" : "—"}</span>}
                      <div className={`text-xs ${n.snr.total < 10 ? "text-amber" : "text-ink-faint"}`}>
                        SNR {n.snr.total.toPrecision(3)}
                        {n.snr.total < 10 ? ": not trustworthy" : ""}
                        {row?.status === "ill_conditioned" ? ", ill-conditioned" : ""}
                      </div>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
