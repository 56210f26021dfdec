/**
 * A small BibTeX reader and writer for single references: enough for a paste box and for exporting
 * what the catalogue cites. It reads @type{key, field = {..} | ".." | number | macro, ...} with nested
 * braces, # concatenation and the month macros, turns common LaTeX accents into Unicode, and writes
 * entries that it reads back to the same reference (see tests/api/catalogue-references.test.ts).
 */

export interface BibtexEntry {
  type: string;
  key: string;
  /** Field names lower-cased; values as written (braces and escapes kept). */
  fields: Record<string, string>;
}

export interface BibReference {
  key?: string;
  arxiv?: string;
  doi?: string;
  authors: string[];
  title: string;
  year: number;
  journal?: string;
  volume?: string;
  pages?: string;
  note?: string;
}

/** A BibTeX problem, named by the field at fault ("bibtex" for the text as a whole). */
export class BibtexError extends Error {
  readonly field: string;
  constructor(field: string, message: string) {
    super(message);
    this.name = "BibtexError";
    this.field = field;
  }
}

const MONTHS: Record<string, string> = {
  jan: "January", feb: "February", mar: "March", apr: "April", may: "May", jun: "June",
  jul: "July", aug: "August", sep: "September", oct: "October", nov: "November", dec: "December",
};

/** Reads every entry in the text (comments, @string and @preamble are skipped). */
export function parseBibtexEntries(text: string): BibtexEntry[] {
  const entries: BibtexEntry[] = [];
  const macros: Record<string, string> = { ...MONTHS };
  let i = 0;
  while (i < text.length) {
    const at = text.indexOf("@", i);
    if (at < 0) break;
    let j = at + 1;
    while (j < text.length && /[A-Za-z]/.test(text[j] as string)) j++;
    const type = text.slice(at + 1, j).toLowerCase();
    j = skipSpace(text, j);
    const open = text[j];
    if (!type || (open !== "{" && open !== "(")) {
      i = at + 1;
      continue;
    }
    const close = open === "{" ? "}" : ")";
    const end = findClosing(text, j, open, close);
    if (end < 0) throw new BibtexError("bibtex", `the @${type} entry is not closed: a '${close}' is missing`);
    const body = text.slice(j + 1, end);
    i = end + 1;
    if (type === "comment" || type === "preamble") continue;
    if (type === "string") {
      const { fields } = readFields(body, macros, `@string`);
      Object.assign(macros, fields);
      continue;
    }
    const comma = body.indexOf(",");
    const key = (comma < 0 ? body : body.slice(0, comma)).trim();
    if (!key || /[\s{}"=]/.test(key)) throw new BibtexError("bibtex", `the @${type} entry has no citation key before its first comma`);
    const { fields } = readFields(comma < 0 ? "" : body.slice(comma + 1), macros, key);
    entries.push({ type, key, fields });
  }
  return entries;
}

function skipSpace(s: string, i: number): number {
  while (i < s.length && /\s/.test(s[i] as string)) i++;
  return i;
}

function findClosing(s: string, openAt: number, open: string, close: string): number {
  let depth = 0;
  for (let k = openAt; k < s.length; k++) {
    const c = s[k];
    if (c === "\\") {
      k++;
      continue;
    }
    if (c === open) depth++;
    else if (c === close && --depth === 0) return k;
  }
  return -1;
}

function readFields(body: string, macros: Record<string, string>, where: string): { fields: Record<string, string> } {
  const fields: Record<string, string> = {};
  let i = 0;
  while (true) {
    i = skipSpace(body, i);
    while (body[i] === ",") i = skipSpace(body, i + 1);
    if (i >= body.length) break;
    const nameMatch = /^[A-Za-z][\w\-:.+]*/.exec(body.slice(i));
    if (!nameMatch) throw new BibtexError("bibtex", `in ${where}: expected a field name at "${body.slice(i, i + 20)}"`);
    const name = nameMatch[0].toLowerCase();
    i = skipSpace(body, i + nameMatch[0].length);
    if (body[i] !== "=") throw new BibtexError(name, `in ${where}: field "${name}" has no "=" after its name`);
    i++;
    let value = "";
    while (true) {
      i = skipSpace(body, i);
      const c = body[i];
      if (c === "{") {
        const end = findClosing(body, i, "{", "}");
        if (end < 0) throw new BibtexError(name, `in ${where}: the value of "${name}" has an unclosed "{"`);
        value += body.slice(i + 1, end);
        i = end + 1;
      } else if (c === '"') {
        let k = i + 1;
        let depth = 0;
        for (; k < body.length; k++) {
          const ch = body[k];
          if (ch === "\\") k++;
          else if (ch === "{") depth++;
          else if (ch === "}") depth--;
          else if (ch === '"' && depth === 0) break;
        }
        if (k >= body.length) throw new BibtexError(name, `in ${where}: the value of "${name}" has an unclosed quote`);
        value += body.slice(i + 1, k);
        i = k + 1;
      } else {
        const m = /^[\w\-:.+/]+/.exec(body.slice(i));
        if (!m) throw new BibtexError(name, `in ${where}: field "${name}" has no value`);
        const word = m[0];
        value += /^\d+$/.test(word) ? word : (macros[word.toLowerCase()] ?? word);
        i += word.length;
      }
      i = skipSpace(body, i);
      if (body[i] === "#") {
        i++;
        continue;
      }
      break;
    }
    if (i < body.length && body[i] !== ",") throw new BibtexError(name, `in ${where}: expected "," after the value of "${name}"`);
    fields[name] = value;
  }
  return { fields };
}

// ---------------------------------------------------------------------------------------------
// LaTeX text <-> plain Unicode

const ACCENTS: Record<string, Record<string, string>> = {
  '"': { a: "ä", e: "ë", i: "ï", o: "ö", u: "ü", y: "ÿ", A: "Ä", E: "Ë", I: "Ï", O: "Ö", U: "Ü" },
  "'": { a: "á", e: "é", i: "í", o: "ó", u: "ú", y: "ý", c: "ć", n: "ń", s: "ś", z: "ź", A: "Á", E: "É", I: "Í", O: "Ó", U: "Ú", C: "Ć", S: "Ś", Z: "Ź" },
  "`": { a: "à", e: "è", i: "ì", o: "ò", u: "ù", A: "À", E: "È", I: "Ì", O: "Ò", U: "Ù" },
  "^": { a: "â", e: "ê", i: "î", o: "ô", u: "û", A: "Â", E: "Ê", I: "Î", O: "Ô", U: "Û" },
  "~": { a: "ã", n: "ñ", o: "õ", A: "Ã", N: "Ñ", O: "Õ" },
  c: { c: "ç", C: "Ç", s: "ş", S: "Ş" },
  v: { c: "č", s: "š", z: "ž", r: "ř", e: "ě", n: "ň", C: "Č", S: "Š", Z: "Ž", R: "Ř" },
  H: { o: "ő", u: "ű", O: "Ő", U: "Ű" },
  k: { a: "ą", e: "ę", A: "Ą", E: "Ę" },
  u: { a: "ă", g: "ğ", A: "Ă", G: "Ğ" },
};
const LETTERS: Record<string, string> = { o: "ø", O: "Ø", l: "ł", L: "Ł", ss: "ß", ae: "æ", AE: "Æ", aa: "å", AA: "Å", i: "ı" };

/** Turns BibTeX field text into plain text: accents to Unicode, escapes undone, grouping braces dropped. Math ($...$) is kept as is. */
export function latexToText(value: string): string {
  let out = "";
  let i = 0;
  const s = value;
  while (i < s.length) {
    const c = s[i] as string;
    if (c === "$") {
      const end = s.indexOf("$", i + 1);
      if (end > i) {
        out += s.slice(i, end + 1);
        i = end + 1;
        continue;
      }
    }
    if (c === "\\") {
      const next = s[i + 1] ?? "";
      if ("&%#_{}$".includes(next)) {
        out += next;
        i += 2;
        continue;
      }
      const accentTable = ACCENTS[next];
      if (accentTable && ("\"'`^~".includes(next) || /[^A-Za-z]/.test(s[i + 2] ?? "") || s[i + 2] === "{")) {
        let k = i + 2;
        while (s[k] === " ") k++;
        let letter = s[k] ?? "";
        let consumed = k + 1;
        if (letter === "{") {
          const close = s.indexOf("}", k);
          letter = close > k ? s.slice(k + 1, close).replace(/^\\/, "") : "";
          consumed = close + 1;
        } else if (letter === "\\") {
          letter = s[k + 1] ?? "";
          consumed = k + 2;
        }
        const mapped = accentTable[letter];
        if (mapped) {
          out += mapped;
          i = consumed;
          continue;
        }
      }
      const word = /^[A-Za-z]+/.exec(s.slice(i + 1))?.[0];
      if (word && LETTERS[word]) {
        out += LETTERS[word];
        i += 1 + word.length;
        if (s[i] === " ") i++;
        continue;
      }
      out += c;
      i++;
      continue;
    }
    if (c === "{" || c === "}") {
      i++;
      continue;
    }
    if (c === "~") {
      out += " ";
      i++;
      continue;
    }
    out += c;
    i++;
  }
  return out.replace(/\s+/g, " ").trim();
}

/** Escapes plain text for a braced BibTeX value; math ($...$) is left alone. */
export function textToLatex(value: string): string {
  const parts = value.split(/(\$[^$]*\$)/);
  return parts.map((p, idx) => (idx % 2 === 1 ? p : p.replace(/[&%#_{}]/g, (m) => `\\${m}`))).join("");
}

/** Splits an author list at " and " outside braces; braces protect corporate names. */
export function splitAuthors(value: string): string[] {
  const names: string[] = [];
  let depth = 0;
  let start = 0;
  for (let k = 0; k < value.length; k++) {
    const c = value[k];
    if (c === "{") depth++;
    else if (c === "}") depth--;
    else if (depth === 0 && /\s/.test(c as string)) {
      const m = /^\s+and\s+/i.exec(value.slice(k));
      if (m) {
        names.push(value.slice(start, k));
        k += m[0].length - 1;
        start = k + 1;
      }
    }
  }
  names.push(value.slice(start));
  return names.map((n) => latexToText(n)).filter(Boolean);
}

// ---------------------------------------------------------------------------------------------
// Entry <-> reference

function stripArxiv(v: string): string {
  return v.trim().replace(/^arxiv:\s*/i, "");
}

function stripDoi(v: string): string {
  return v.trim().replace(/^(?:https?:\/\/(?:dx\.)?doi\.org\/|doi:\s*)/i, "");
}

/** Reads one reference from BibTeX text. Format checks of arXiv ids and DOIs are the caller's (zod). */
export function parseBibtexReference(text: string): BibReference {
  const entries = parseBibtexEntries(text);
  const entry = entries[0];
  if (!entry) throw new BibtexError("bibtex", "no BibTeX entry found: expected something like @article{key, author = {...}, ...}");
  if (entries.length > 1) throw new BibtexError("bibtex", `found ${entries.length} entries; paste one at a time`);
  const f = entry.fields;
  const authorField = f.author ?? f.editor;
  if (!authorField || !authorField.trim()) throw new BibtexError("author", "the entry has no author field");
  const title = f.title === undefined ? "" : latexToText(f.title);
  if (!title) throw new BibtexError("title", "the entry has no title field");
  const yearText = (f.year ?? f.date ?? "").trim();
  const yearMatch = /^(\d{4})(?:-\d{2}(?:-\d{2})?)?$/.exec(latexToText(yearText));
  if (!yearText) throw new BibtexError("year", "the entry has no year field");
  if (!yearMatch) throw new BibtexError("year", `year "${yearText}" is not a four-digit year`);

  const ref: BibReference = { key: entry.key, authors: splitAuthors(authorField), title, year: Number(yearMatch[1]) };
  const archive = (f.archiveprefix ?? f.eprinttype ?? "").toLowerCase();
  const eprint = f.eprint ?? f.arxiv ?? f.arxivid;
  if (eprint && (archive === "" || archive === "arxiv" || f.arxiv !== undefined || f.arxivid !== undefined)) ref.arxiv = stripArxiv(latexToText(eprint));
  if (f.doi) ref.doi = stripDoi(f.doi.replace(/\\_/g, "_"));
  const journal = f.journal ?? f.journaltitle ?? f.booktitle;
  if (journal) ref.journal = latexToText(journal);
  if (f.volume) ref.volume = latexToText(f.volume);
  if (f.pages) ref.pages = latexToText(f.pages).replace(/\s*-{1,3}\s*/g, "-");
  if (f.note) ref.note = latexToText(f.note);
  return ref;
}

/** A citation key made from the first author's surname and the year (yagi2012). */
export function suggestKey(ref: Pick<BibReference, "authors" | "year">): string {
  const first = ref.authors[0] ?? "anon";
  const surname = first.includes(",") ? first.split(",")[0] ?? first : (first.trim().split(/\s+/).pop() ?? first);
  const ascii = surname
    .normalize("NFD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^A-Za-z0-9]/g, "")
    .toLowerCase();
  return `${ascii || "ref"}${ref.year}`;
}

function braced(value: string): string {
  return `{${textToLatex(value)}}`;
}

function authorToBibtex(name: string): string {
  // A name holding " and " or a comma-free corporate name would be split or reordered: protect it.
  return /\sand\s/i.test(name) ? `{${textToLatex(name)}}` : textToLatex(name);
}

/** Writes one reference as a BibTeX entry: @article with a journal, else @misc (an e-print). */
export function formatBibtexReference(ref: BibReference, key = ref.key ?? suggestKey(ref)): string {
  const lines: [string, string][] = [];
  // "A. Author et al." as typed in a list becomes BibTeX's own "A. Author and others".
  const names = ref.authors.flatMap((a) => (/\s+et\s+al\.?$/.test(a) ? [a.replace(/\s+et\s+al\.?$/, ""), "others"] : [a]));
  lines.push(["author", `{${names.map(authorToBibtex).join(" and ")}}`]);
  lines.push(["title", `{${braced(ref.title)}}`]);
  if (ref.journal) lines.push(["journal", braced(ref.journal)]);
  if (ref.volume) lines.push(["volume", braced(ref.volume)]);
  if (ref.pages) lines.push(["pages", braced(ref.pages)]);
  lines.push(["year", `{${ref.year}}`]);
  if (ref.doi) lines.push(["doi", `{${ref.doi}}`]);
  if (ref.arxiv) {
    lines.push(["eprint", `{${ref.arxiv}}`]);
    lines.push(["archivePrefix", "{arXiv}"]);
  }
  if (ref.note) lines.push(["note", braced(ref.note)]);
  const type = ref.journal ? "article" : "misc";
  return `@${type}{${key},\n${lines.map(([k, v]) => `  ${k} = ${v},`).join("\n")}\n}\n`;
}

/** Writes several references, keeping citation keys unique (a second yagi2012 becomes yagi2012b). */
export function formatBibtexFile(refs: BibReference[]): string {
  const used = new Set<string>();
  return refs
    .map((r) => {
      const base = r.key ?? suggestKey(r);
      let key = base;
      for (let n = 1; used.has(key); n++) key = `${base}${String.fromCharCode(97 + n)}`;
      used.add(key);
      return formatBibtexReference(r, key);
    })
    .join("\n");
}
