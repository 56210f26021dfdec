/**
 * Reads pasted or uploaded CSV (header row: b or k; upper, or lo and hi for a signed interval with an
 * empty cell for an open side; optional label) into raw rows. Cells are
 * turned into numbers where they are numbers and kept as text otherwise; the shared table schema then
 * judges them, so a bad cell is reported exactly as the server would. papaparse loads on first use.
 */
type Cell = number | string;
export interface ParsedCsv {
  rows: Record<string, Cell | [Cell | null, Cell | null]>[];
  problems: string[];
}

function cell(value: string | undefined): number | string | undefined {
  if (value === undefined) return undefined;
  const t = value.trim();
  if (t === "") return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

export async function parseBoundsCsv(text: string): Promise<ParsedCsv> {
  const { default: Papa } = await import("papaparse");
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), {
    header: true,
    skipEmptyLines: "greedy",
    transformHeader: (h) => h.trim().toLowerCase(),
  });
  const headers = parsed.meta.fields ?? [];
  const problems: string[] = [];
  const hasBound = headers.includes("upper") || headers.includes("lo") || headers.includes("hi");
  if (!hasBound || !(headers.includes("b") || headers.includes("k"))) {
    problems.push(`The first line must name the columns b (or k) and upper (or lo and hi); it names ${headers.length ? headers.join(", ") : "nothing"}.`);
    return { rows: [], problems };
  }
  for (const e of parsed.errors) {
    if (e.code === "TooFewFields") continue;
    problems.push(`line ${(e.row ?? 0) + 2}: ${e.message}`);
  }
  const rows = parsed.data.map((r) => {
    const row: ParsedCsv["rows"][number] = {};
    for (const key of ["b", "k", "upper"] as const) {
      const v = cell(r[key]);
      if (v !== undefined) row[key] = v;
    }
    const lo = cell(r.lo);
    const hi = cell(r.hi);
    if (lo !== undefined || hi !== undefined) row.interval = [lo ?? null, hi ?? null];
    const label = r.label?.trim();
    if (label) row.label = label;
    return row;
  });
  if (rows.length === 0) problems.push("There are no rows under the header.");
  return { rows, problems };
}
