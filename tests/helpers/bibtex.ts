import { parse, type Entry } from "@retorquere/bibtex-parser";

/** Reads a whole exported BibTeX file back with the same maintained parser the server uses for pasted entries. */
export function readBibtexFile(text: string): Entry[] {
  const library = parse(text, { english: false, sentenceCase: false, caseProtection: false, unsupported: "ignore" });
  if (library.errors.length) throw new Error(`BibTeX did not parse: ${library.errors.map((e) => e.error).join("; ")}`);
  return library.entries;
}
