import type { SheetRecord, SheetRecordInput } from "../../../../common/sheets.ts";

/** A stored record as the input that would save it again (a PATCH sends the whole record list). */
export function recordInput(r: SheetRecord): SheetRecordInput {
  return {
    label: r.label,
    detector_network: r.detector_network,
    analysis_method: r.analysis_method,
    data_link: r.data_link,
    notes: r.notes,
    bound: r.bound,
    binary: r.binary,
    cosmology: r.cosmology,
    conventions: r.conventions,
  };
}
