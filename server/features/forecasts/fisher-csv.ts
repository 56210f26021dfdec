import { ValidationError } from "../../errors.ts";

/**
 * A Fisher matrix as CSV: a header row of parameter names, then one row of numbers per parameter in
 * the same order (an optional leading column repeating the row's name is accepted). Commas,
 * semicolons or tabs separate cells; # comments and blank lines are skipped.
 */
export function parseFisherCsv(text: string, field: string): { parameters: string[]; matrix: number[][] } {
  const refuse = (line: number, message: string): never => {
    throw new ValidationError(`Invalid request body: ${field}: line ${line}: ${message}`, { [field]: `line ${line}: ${message}` });
  };
  const rows = text
    .split(/\r\n|\r|\n/)
    .map((raw, i) => ({ line: i + 1, cells: raw.replace(/#.*$/, "").trim() }))
    .filter((r) => r.cells !== "")
    .map((r) => ({ line: r.line, cells: r.cells.split(/\s*[,;\t]\s*/) }));
  const header = rows.shift();
  if (!header) throw new ValidationError(`Invalid request body: ${field}: empty`, { [field]: "empty: a header row of parameter names is needed" });
  let names = header.cells.map((c) => c.replace(/^"|"$/g, "").trim());
  if (names[0] === "") names = names.slice(1);
  if (names.some((n) => n === "" || /^[-+.\d]/.test(n))) refuse(header.line, "the first row must name the parameters");
  if (rows.length !== names.length) refuse(rows[rows.length - 1]?.line ?? header.line, `expected ${names.length} rows (one per parameter), found ${rows.length}`);
  const matrix = rows.map((r, i) => {
    let cells = r.cells;
    if (cells.length === names.length + 1) {
      if (cells[0]!.replace(/^"|"$/g, "").trim() !== names[i]) refuse(r.line, `the row label "${cells[0]}" should be ${names[i]}`);
      cells = cells.slice(1);
    }
    if (cells.length !== names.length) refuse(r.line, `expected ${names.length} numbers, found ${cells.length}`);
    return cells.map((c, j) => {
      const v = Number(c);
      if (c.trim() === "" || !Number.isFinite(v)) refuse(r.line, `column ${names[j]}: "${c}" is not a number`);
      return v;
    });
  });
  return { parameters: names, matrix };
}
