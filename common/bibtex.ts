/**
 * BibTeX out: the entries the catalogue, a theory page and a sheet export. Reading pasted BibTeX is the
 * server's (server/features/references/bibtex-read.ts, a maintained parser); the tests read every
 * exported file back with that same parser.
 */

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

/** Escapes plain text for a braced BibTeX value; math ($...$) is left alone. */
export function textToLatex(value: string): string {
  const parts = value.split(/(\$[^$]*\$)/);
  return parts.map((p, idx) => (idx % 2 === 1 ? p : p.replace(/[&%#_{}]/g, (m) => `\\${m}`))).join("");
}

// ---------------------------------------------------------------------------------------------
// Entry <-> reference

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


// ---------------------------------------------------------------------------------------------
// Unicode -> LaTeX, so the file works with classic BibTeX and pdflatex without inputenc tricks

const COMBINING: Record<string, string> = {
  "\u0300": "`", "\u0301": "'", "\u0302": "^", "\u0303": "~", "\u0304": "=", "\u0306": "u", "\u0307": ".",
  "\u0308": '"', "\u030a": "r", "\u030b": "H", "\u030c": "v", "\u0327": "c", "\u0328": "k",
};
const SPECIAL_LETTERS: Record<string, string> = {
  "ø": "{\\o}", "Ø": "{\\O}", "ł": "{\\l}", "Ł": "{\\L}", "ß": "{\\ss}", "æ": "{\\ae}", "Æ": "{\\AE}",
  "œ": "{\\oe}", "Œ": "{\\OE}", "ı": "{\\i}", "đ": "{\\dj}", "–": "--", "—": "---", "’": "'", "‘": "`",
  "“": "``", "”": "''", "∼": "$\\sim$", "×": "$\\times$", "±": "$\\pm$", "²": "$^2$", "³": "$^3$",
};
const GREEK = "alpha beta gamma delta epsilon zeta eta theta iota kappa lambda mu nu xi omicron pi rho sigma tau upsilon phi chi psi omega".split(" ");

function unicodeToLatex(text: string): string {
  let out = "";
  for (const ch of text) {
    const code = ch.codePointAt(0) ?? 0;
    if (code < 0x80) {
      out += ch;
      continue;
    }
    const special = SPECIAL_LETTERS[ch];
    if (special) {
      out += special;
      continue;
    }
    if (code >= 0x3b1 && code <= 0x3c9 && code !== 0x3c2) {
      const name = GREEK[code - 0x3b1 - (code > 0x3c2 ? 1 : 0)];
      if (name && name !== "omicron") {
        out += `$\\${name}$`;
        continue;
      }
    }
    const [base, ...marks] = [...ch.normalize("NFD")];
    const mark = marks.length === 1 ? COMBINING[marks[0] as string] : undefined;
    if (base && mark) {
      const letter = base === "i" ? "\\i" : base;
      out += /[A-Za-z]/.test(mark) ? `{\\${mark}{${letter}}}` : `{\\${mark}${letter}}`;
      continue;
    }
    out += ch;
  }
  return out;
}

function braced(value: string): string {
  return `{${unicodeToLatex(textToLatex(value))}}`;
}

const CORPORATE = /\b(?:collaborations?|consortium|team|group|project|observator(?:y|ies)|scientific|survey)\b/i;

/** True for an author that is an organisation: BibTeX must not split it into first and last names. */
export function isCorporateAuthor(name: string): boolean {
  return CORPORATE.test(name) || /\sand\s/i.test(name);
}

function authorToBibtex(name: string): string {
  const latex = unicodeToLatex(textToLatex(name));
  return isCorporateAuthor(name) ? `{${latex}}` : latex;
}

/** Page ranges go to `pages`; a single article number (Phys. Rev. style) to `eid`, and `pages` as well for styles without eid. */
function pageFields(pages: string): [string, string][] {
  const range = /^\s*([A-Za-z]?\d+)\s*[-\u2013\u2014]+\s*([A-Za-z]?\d+)\s*$/.exec(pages);
  if (range) return [["pages", `{${range[1]}--${range[2]}}`]];
  const cleaned = pages.trim().replace(/\(R\)$/, "");
  return [
    ["pages", braced(cleaned)],
    ["eid", braced(cleaned)],
  ];
}

/**
 * Writes one reference as an @article entry: journal, volume, pages (or eid), doi, eprint and
 * archivePrefix. An e-print without a journal is written as journal "arXiv e-prints" with the arXiv id
 * as its eid (the form the astrophysics data services use; common practice).
 */
export function formatBibtexReference(ref: BibReference, key = ref.key ?? suggestKey(ref)): string {
  const lines: [string, string][] = [];
  // "A. Author et al." as typed in a list becomes BibTeX's own "A. Author and others".
  const names = ref.authors.flatMap((a) => (/\s+et\s+al\.?$/.test(a) ? [a.replace(/\s+et\s+al\.?$/, ""), "others"] : [a]));
  lines.push(["author", `{${names.map(authorToBibtex).join(" and ")}}`]);
  lines.push(["title", `{${braced(ref.title)}}`]);
  if (ref.journal) {
    lines.push(["journal", braced(ref.journal)]);
    if (ref.volume) lines.push(["volume", braced(ref.volume)]);
    if (ref.pages) lines.push(...pageFields(ref.pages));
  } else if (ref.arxiv) {
    lines.push(["journal", "{arXiv e-prints}"]);
    lines.push(["eid", `{arXiv:${ref.arxiv}}`]);
  } else {
    if (ref.volume) lines.push(["volume", braced(ref.volume)]);
    if (ref.pages) lines.push(...pageFields(ref.pages));
  }
  lines.push(["year", `{${ref.year}}`]);
  if (ref.doi) lines.push(["doi", `{${ref.doi}}`]);
  if (ref.arxiv) {
    lines.push(["eprint", `{${ref.arxiv}}`]);
    lines.push(["archivePrefix", "{arXiv}"]);
  }
  if (ref.note) lines.push(["note", braced(ref.note)]);
  return `@article{${key},\n${lines.map(([k, v]) => `  ${k} = ${v},`).join("\n")}\n}\n`;
}

/** What makes two references the same paper: DOI, else arXiv id (without version), else title and year. */
function identity(r: BibReference): string {
  if (r.doi) return `doi:${r.doi.toLowerCase()}`;
  if (r.arxiv) return `arxiv:${r.arxiv.replace(/v\d+$/, "")}`;
  return `title:${r.title.toLowerCase()}:${r.year}`;
}

/**
 * Citation keys for a set of references, stable and unique: the same paper listed twice is written
 * once; different papers that share a key are told apart by a letter suffix assigned in the order of
 * their identity (DOI, arXiv id, title), not in the order of the list, so a re-export keeps the keys.
 */
export function assignCitationKeys(refs: BibReference[]): { ref: BibReference; key: string }[] {
  const byIdentity = new Map<string, BibReference>();
  for (const r of refs) if (!byIdentity.has(identity(r))) byIdentity.set(identity(r), r);
  const groups = new Map<string, string[]>();
  for (const [id, r] of byIdentity) {
    const base = r.key ?? suggestKey(r);
    groups.set(base, [...(groups.get(base) ?? []), id]);
  }
  const keyOf = new Map<string, string>();
  const taken = new Set(groups.keys());
  for (const [base, ids] of groups) {
    ids.sort();
    ids.forEach((id, n) => {
      if (n === 0) {
        keyOf.set(id, base);
        return;
      }
      let suffix = n;
      let key = `${base}${String.fromCharCode(97 + suffix)}`;
      while (taken.has(key)) key = `${base}${String.fromCharCode(97 + ++suffix)}`;
      taken.add(key);
      keyOf.set(id, key);
    });
  }
  return [...byIdentity].map(([id, ref]) => ({ ref, key: keyOf.get(id) ?? ref.key ?? suggestKey(ref) }));
}

/** Writes several references with stable, unique citation keys (see assignCitationKeys). */
export function formatBibtexFile(refs: BibReference[]): string {
  return assignCitationKeys(refs)
    .map(({ ref, key }) => formatBibtexReference(ref, key))
    .join("\n");
}
