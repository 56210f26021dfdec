import type { ConvertResponse } from "../../common/convert.ts";
import type { SheetRecord, TranslationRecord } from "../../common/sheets.ts";

/** The record as a translation record (a test fails loudly if it is another kind). */
export function asTranslation(r: SheetRecord): TranslationRecord {
  if (r.kind !== "translation") throw new Error(`record ${r.id} is a ${r.kind} record, not a translation`);
  return r;
}

/** The stored translation of a translation record. */
export function translationOf(r: SheetRecord): ConvertResponse {
  return asTranslation(r).translation;
}
