import { parse, type Creator } from "@retorquere/bibtex-parser";
import { BibtexError, type BibReference } from "../../../common/bibtex.ts";

/**
 * Reads one pasted BibTeX entry into a reference with a maintained BibTeX parser
 * (@retorquere/bibtex-parser), which also turns LaTeX accents, escapes and simple math into Unicode.
 * Server-only: the parser is large and the client never needs it.
 */

const PARSE_OPTIONS = {
  // Titles are kept as written: no sentence-casing, no case-protection markup.
  english: false,
  sentenceCase: false as const,
  caseProtection: false,
  unsupported: "ignore" as const,
};

/** The parser marks emphasis, super/subscripts and protected case with HTML tags: a stored title is plain text. */
function plain(value: string): string {
  return value
    .replace(/<\/?(?:i|b|em|strong|sup|sub|sc|span|nc)(?:\s[^>]*)?>/gi, "")
    .replace(/\s+/g, " ")
    .trim()
    .normalize("NFC");
}

/** A person as "First von Last, Jr."; a brace-protected name (a collaboration) as written. */
function creatorName(c: Creator): string {
  if (c.name) return plain(c.name);
  const parts = [c.firstName, c.prefix, c.lastName].filter((p): p is string => Boolean(p && p.trim()));
  const name = parts.join(" ");
  return plain(c.suffix ? `${name}, ${c.suffix}` : name);
}

function stripArxiv(v: string): string {
  return v.trim().replace(/^arxiv:\s*/i, "");
}

function stripDoi(v: string): string {
  return v.trim().replace(/^(?:https?:\/\/(?:dx\.)?doi\.org\/|doi:\s*)/i, "");
}

export function readBibtexReference(text: string): BibReference {
  if (!/@\s*[A-Za-z]+\s*[{(]/.test(text)) {
    throw new BibtexError("bibtex", "no BibTeX entry found: expected something like @article{key, author = {...}, ...}");
  }
  const library = parse(text, PARSE_OPTIONS);
  const firstError = library.errors[0];
  if (firstError) throw new BibtexError("bibtex", `the entry could not be read: ${firstError.error}`);
  const entries = library.entries;
  const entry = entries[0];
  if (!entry) throw new BibtexError("bibtex", "no BibTeX entry found: expected something like @article{key, author = {...}, ...}");
  if (entries.length > 1) throw new BibtexError("bibtex", `found ${entries.length} entries; paste one at a time`);

  const f = entry.fields;
  const creators = f.author?.length ? f.author : (f.editor ?? []);
  const authors = creators.map(creatorName).filter(Boolean);
  if (!authors.length) throw new BibtexError("author", "the entry has no author field");
  const title = plain(f.title ?? "");
  if (!title) throw new BibtexError("title", "the entry has no title field");
  const yearText = plain(f.year ?? f.date ?? "");
  if (!yearText) throw new BibtexError("year", "the entry has no year field");
  const yearMatch = /^(\d{4})(?:-\d{2}(?:-\d{2})?)?$/.exec(yearText);
  if (!yearMatch) throw new BibtexError("year", `year "${yearText}" is not a four-digit year`);

  const ref: BibReference = { key: entry.key, authors: authors.map((a) => (a === "others" ? "others" : a)), title, year: Number(yearMatch[1]) };
  if (ref.authors.at(-1) === "others" && ref.authors.length > 1) {
    ref.authors = [...ref.authors.slice(0, -2), `${ref.authors.at(-2) ?? ""} et al.`];
  }
  const archive = (f.archiveprefix ?? f.eprinttype ?? "").toLowerCase();
  const eprint = f.eprint ?? f.arxiv ?? f.arxivid;
  if (eprint && (archive === "" || archive === "arxiv" || f.arxiv !== undefined || f.arxivid !== undefined)) ref.arxiv = stripArxiv(plain(eprint));
  if (f.doi) ref.doi = stripDoi(f.doi);
  const journal = f.journal ?? f.journaltitle ?? f.booktitle;
  if (journal && !/^arxiv e-?prints?$/i.test(plain(journal))) ref.journal = plain(journal);
  if (f.volume) ref.volume = plain(f.volume);
  const pages = f.pages ?? f.eid;
  if (pages && !/^arxiv:/i.test(pages)) ref.pages = plain(pages).replace(/\s*[-\u2013\u2014]{1,3}\s*/g, "-");
  if (f.note) ref.note = plain(f.note);
  return ref;
}
