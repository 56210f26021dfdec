import { useState } from "react";
import { conditionText, symbolText } from "../../../../common/symbol-text.ts";
import { boundShapeLabel, toShape, type BoundShape } from "./bound-form.tsx";
import { VerdictBadge } from "./results-table.tsx";
import { eventsRequestSchema, MAX_EVENTS, type EventsRequest, type EventsResponse } from "../../../../common/convert-samples.ts";
import { Button } from "../../../components/ui/button.tsx";
import { Field, Select, TextInput } from "../../../components/ui/field.tsx";
import { ErrorNote } from "../../../components/ui/states.tsx";
import { ApiError } from "../../../lib/api-client.ts";
import { useConvertEvents } from "../api/convert-events.ts";
import { useTheoriesAtB } from "../api/theories-at-b.ts";
import { CautionList } from "./caution-list.tsx";
import { bOfDeviation, DEFAULT_DEVIATION, DeviationFields, deviationRequest, useCheckedRequest, type DeviationValues, type TheoryOption } from "./samples-panel-fields.tsx";
import { SciNumber, unitText } from "./sci-number.tsx";

export interface EventRow {
  label: string;
  m1: string;
  m2: string;
  chi1: string;
  chi2: string;
  bodies: string;
  z: string;
  /** How this event's bound is stated (as on the single-bound form): |x| <= upper, [lo, hi], or one end. */
  shape: BoundShape;
  upper: string;
  lo: string;
  hi: string;
}

// Accessible names differ from the single-bound form's labels ("m₁ (M☉)" there), so each control is found by one name.
const COLUMNS: { key: TextKey; label: string; spoken: string; width: string }[] = [
  { key: "label", label: "Event", spoken: "label", width: "w-32" },
  { key: "m1", label: "m₁ (M☉)", spoken: "primary mass", width: "w-20" },
  { key: "m2", label: "m₂ (M☉)", spoken: "secondary mass", width: "w-20" },
  { key: "chi1", label: "χ₁", spoken: "primary spin", width: "w-16" },
  { key: "chi2", label: "χ₂", spoken: "secondary spin", width: "w-16" },
  { key: "z", label: "z", spoken: "redshift", width: "w-16" },
];
type TextKey = "label" | "m1" | "m2" | "chi1" | "chi2" | "z" | "upper" | "lo" | "hi";

/**
 * Invented events of the fictional Kestrel-Vireo network. Their bounds are tight enough that the EdGB
 * limits stay inside the small-coupling regime (16 pi alpha^2 / m_i^4 below 1/6 on every black hole),
 * so the example shows a combination; looser bounds would be listed as outside validity and left out.
 */
export const EXAMPLE_EVENTS: EventRow[] = [
  { label: "KV-231107a", m1: "10", m2: "5", chi1: "0", chi2: "0", bodies: "bh,bh", z: "0.1", shape: "symmetric", upper: "1e-5", lo: "", hi: "" },
  { label: "KV-240322c", m1: "35", m2: "9", chi1: "0.2", chi2: "0", bodies: "bh,bh", z: "0.3", shape: "symmetric", upper: "2e-5", lo: "", hi: "" },
  { label: "KV-240815b", m1: "7", m2: "1.4", chi1: "0", chi2: "0", bodies: "bh,ns", z: "0.05", shape: "symmetric", upper: "2e-5", lo: "", hi: "" },
];

const num = (s: string): unknown => {
  const t = s.trim();
  if (t === "") return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
};

/** An interval end: blank is open (null). */
const end = (s: string): unknown => (s.trim() === "" ? null : num(s));

function boundOfRow(r: EventRow): { upper: unknown } | { interval: [unknown, unknown] } {
  switch (r.shape) {
    case "symmetric":
      return { upper: num(r.upper) };
    case "interval":
      return { interval: [end(r.lo), end(r.hi)] };
    case "lower_only":
      return { interval: [end(r.lo), null] };
    case "upper_only":
      return { interval: [null, end(r.hi)] };
  }
}

export function eventsCandidate(deviation: DeviationValues, rows: readonly EventRow[], frame: "source" | "detector"): unknown {
  return {
    ...deviationRequest(deviation),
    events: rows.map((r) => ({
      label: r.label,
      ...boundOfRow(r),
      binary: { m1: num(r.m1), m2: num(r.m2), chi1: num(r.chi1), chi2: num(r.chi2), bodies: r.bodies.split(","), frame, ...(r.z.trim() === "" ? {} : { z: num(r.z) }) },
    })),
  };
}

/** "events.1.binary.m1" -> "KV-240322c, m1: ...". */
function describeEventIssue(path: string, message: string, rows: readonly EventRow[]): string {
  const m = /^events\.(\d+)\.?(.*)$/.exec(path);
  if (!m) return `${path}: ${message}`;
  const row = rows[Number(m[1])];
  return `${row?.label || `event ${Number(m[1]) + 1}`}${m[2] ? `, ${m[2].replace(/^binary\./, "")}` : ""}: ${message}`;
}

interface FormProps {
  theories: readonly TheoryOption[];
  theoriesLoading: boolean;
  deviation: DeviationValues;
  onDeviation: (v: DeviationValues) => void;
  onSubmit: (request: EventsRequest) => void;
  busy: boolean;
  serverFields: Record<string, string>;
}

export function EventsForm({ theories, theoriesLoading, deviation, onDeviation, onSubmit, busy, serverFields }: FormProps) {
  const [rows, setRows] = useState<EventRow[]>(EXAMPLE_EVENTS);
  const [frame, setFrame] = useState<"source" | "detector">("source");
  const { errors: all, listed, submit } = useCheckedRequest(eventsRequestSchema, serverFields, onSubmit);
  const setCell = (i: number, key: keyof EventRow, value: string) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, [key]: key === "shape" ? toShape(value) : value } : r)));
  const x = deviation.parameter === "ppe_beta" ? "β" : "δφ";
  const boundInput = (r: EventRow, i: number, key: "upper" | "lo" | "hi", spoken: string) => (
    <TextInput
      aria-label={`Event ${i + 1} ${spoken}`}
      aria-invalid={Boolean(all[`events.${i}.${key === "upper" ? "upper" : "interval"}`] ?? all[`events.${i}.interval.${key === "lo" ? 0 : 1}`])}
      className="w-24"
      value={r[key]}
      placeholder={key === "upper" ? "U" : key}
      onChange={(e) => setCell(i, key, e.target.value)}
      data-testid={`event-${i}-${key}`}
    />
  );

  const run = () => submit(eventsCandidate(deviation, rows, frame));

  return (
    <div className="flex flex-col gap-4">
      <DeviationFields idPrefix="events" value={deviation} onChange={onDeviation} theories={theories} theoriesLoading={theoriesLoading} errors={all} />
      <div className="relative overflow-x-auto rounded border border-paper-edge bg-white/40">
        <table className="border-collapse text-sm" data-testid="events-input">
          <caption className="sr-only">Events: one bound and one binary each</caption>
          <thead className="bg-paper-deep text-left">
            <tr>
              {COLUMNS.map((c) => (
                <th key={c.key} scope="col" className="px-2 py-1.5 font-semibold">
                  {conditionText(c.label)}
                </th>
              ))}
              <th scope="col" className="px-2 py-1.5 font-semibold">
                Bound on {x}
              </th>
              <th scope="col" className="px-2 py-1.5 font-semibold">Bodies</th>
              <th scope="col" className="px-2 py-1.5">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={i} className="border-b border-paper-edge/70">
                {COLUMNS.map((c) => (
                  <td key={c.key} className="px-1 py-1">
                    <TextInput
                      aria-label={`Event ${i + 1} ${c.spoken}`}
                      aria-invalid={Boolean(all[`events.${i}.${c.key === "label" ? c.key : `binary.${c.key}`}`])}
                      className={c.width}
                      value={r[c.key]}
                      onChange={(e) => setCell(i, c.key, e.target.value)}
                      data-testid={`event-${i}-${c.key}`}
                    />
                  </td>
                ))}
                <td className="px-1 py-1">
                  <div className="flex items-center gap-1">
                    <Select aria-label={`Event ${i + 1} form of the bound`} value={r.shape} onChange={(e) => setCell(i, "shape", e.target.value)} className="w-44" data-testid={`event-${i}-shape`}>
                      {(["symmetric", "interval", "lower_only", "upper_only"] as const).map((sh) => (
                        <option key={sh} value={sh}>
                          {boundShapeLabel(sh, x)}
                        </option>
                      ))}
                    </Select>
                    {r.shape === "symmetric" && boundInput(r, i, "upper", "bound")}
                    {(r.shape === "interval" || r.shape === "lower_only") && boundInput(r, i, "lo", "lower end")}
                    {(r.shape === "interval" || r.shape === "upper_only") && boundInput(r, i, "hi", "upper end")}
                  </div>
                </td>
                <td className="px-1 py-1">
                  <Select aria-label={`Bodies of event ${i + 1}`} value={r.bodies} onChange={(e) => setCell(i, "bodies", e.target.value)} className="w-32">
                    <option value="bh,bh">BH + BH</option>
                    <option value="bh,ns">BH + NS</option>
                    <option value="ns,ns">NS + NS</option>
                  </Select>
                </td>
                <td className="px-1 py-1">
                  <Button kind="quiet" onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))} disabled={rows.length === 1} aria-label={`Remove event ${i + 1}`}>
                    remove
                  </Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <Button onClick={() => setRows((rs) => [...rs, { label: `event ${rs.length + 1}`, m1: "", m2: "", chi1: "0", chi2: "0", bodies: "bh,bh", z: "", shape: "symmetric", upper: "", lo: "", hi: "" }])} disabled={rows.length >= MAX_EVENTS} data-testid="add-event">
          Add an event
        </Button>
        <Field label="Event masses are">
          {(c) => (
            <Select {...c} value={frame} onChange={(e) => setFrame(e.target.value === "detector" ? "detector" : "source")} className="w-56">
              <option value="source">source frame</option>
              <option value="detector">detector frame (needs z)</option>
            </Select>
          )}
        </Field>
        <Button kind="primary" onClick={run} busy={busy} data-testid="run-events">
          Translate and combine
        </Button>
      </div>
      {listed.length > 0 && (
        <ul role="alert" className="text-sm text-brick" data-testid="events-problems">
          {listed.map(([path, message]) => (
            <li key={path}>{describeEventIssue(path, message, rows)}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

export function EventsResult({ data }: { data: EventsResponse }) {
  const rel = data.coupling.side === "upper" ? "≤" : "≥";
  const unit = unitText(data.coupling.unit);
  return (
    <div className="flex flex-col gap-3" data-testid="events-result">
      <div className="relative overflow-x-auto rounded border border-paper-edge bg-white/40">
        <table className="w-full border-collapse text-[0.95rem]" data-testid="events-table">
          <caption className="sr-only">Each event's limit and the combined limit</caption>
          <thead className="bg-paper-deep text-left text-sm">
            <tr>
              {["Event", `${symbolText(data.coupling.symbol, data.coupling.latex)} limit`, "Validity", "Note"].map((h) => (
                <th key={h} scope="col" className="border-b border-paper-edge px-3 py-2 font-semibold">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {data.events.map((e, i) => (
              <tr key={`${e.label}-${i}`} className="border-b border-paper-edge/70 align-top" data-testid={`events-row-${i}`}>
                <td className="px-3 py-2">{e.label}</td>
                <td className="px-3 py-2 whitespace-nowrap">
                  {e.limit === null ? "—" : <>{rel} <SciNumber value={e.limit} /> {unit}</>}
                  {data.tightest?.label === e.label && e.limit !== null && (
                  <span className="ml-2 text-xs font-semibold text-sea">tightest ({data.coupling.side === "lower" ? "largest" : "smallest"})</span>
                )}
                </td>
                <td className="px-3 py-2 text-sm">{e.verdict === null ? "" : <VerdictBadge verdict={e.verdict} />}</td>
                <td className="px-3 py-2 text-sm text-ink-soft">{e.reason ?? (e.limit !== null && !e.combined ? "left out of the combination" : "")}</td>
              </tr>
            ))}
            <tr className="bg-sea-wash/40 align-top" data-testid="events-combined">
              <th scope="row" className="px-3 py-2 text-left font-semibold">
                Combined ({data.combined?.events_used ?? 0} events)
              </th>
              <td className="px-3 py-2 whitespace-nowrap font-semibold">{data.combined ? <>{rel} <SciNumber value={data.combined.limit} /> {unit}</> : "—"}</td>
              <td colSpan={2} className="px-3 py-2 text-xs text-ink-soft">
                combined under a Gaussian approximation of each event's bound
              </td>
            </tr>
          </tbody>
        </table>
      </div>
      {data.combined && <p className="text-xs text-ink-faint">{data.combined.rule}</p>}
      <CautionList cautions={data.cautions} testId="events-cautions" />
    </div>
  );
}

/** The "Several events" panel: one bound per event, one theory, combined at the coupling level. */
export function EventsPanel() {
  const [deviation, setDeviation] = useState<DeviationValues>(DEFAULT_DEVIATION);
  const [request, setRequest] = useState<EventsRequest | undefined>();
  const theories = useTheoriesAtB(bOfDeviation(deviation));
  const result = useConvertEvents(request);
  const serverFields = result.error instanceof ApiError ? result.error.fields : {};
  return (
    <section aria-labelledby="events-title" className="flex flex-col gap-4">
      <h2 id="events-title" className="text-2xl">
        Several events
      </h2>
      <p className="max-w-3xl text-sm text-ink-soft">
        Each event maps the same coupling to a different deviation, so events are combined at the level of the coupling, never by combining their bounds on the deviation.
      </p>
      <EventsForm
        theories={(theories.data?.theories ?? []).map((t) => ({ slug: t.slug, name: t.name }))}
        theoriesLoading={theories.isFetching}
        deviation={deviation}
        onDeviation={setDeviation}
        onSubmit={setRequest}
        busy={result.isFetching}
        serverFields={serverFields}
      />
      {result.error && Object.keys(serverFields).length === 0 && <ErrorNote error={result.error} title="The events could not be translated." />}
      {result.data && <EventsResult data={result.data} />}
    </section>
  );
}
