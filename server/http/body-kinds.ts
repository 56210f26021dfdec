import { SAMPLE_COLUMNS, samplesRequestSchema, type SamplesRequest } from "../../common/convert-samples.ts";
import { decodeJson, validateBody } from "./json-text.ts";

/**
 * The JSON bodies read with readJsonBody (json-body.ts), by name, so a worker thread can be told
 * which schema to apply: each is validated, then packed for the trip back (large number columns as
 * Float64Arrays whose memory is handed over, not copied).
 */

/** A samples request whose columns are typed arrays (the same numbers, checked finite by the schema). */
export type PackedSamplesRequest = Omit<SamplesRequest, "columns"> & {
  columns: { [K in keyof SamplesRequest["columns"]]: Float64Array | Extract<SamplesRequest["columns"][K], undefined> };
};

function packSamples(request: SamplesRequest): { value: PackedSamplesRequest; transfer: ArrayBuffer[] } {
  const columns: Partial<Record<(typeof SAMPLE_COLUMNS)[number], Float64Array>> = {};
  const transfer: ArrayBuffer[] = [];
  for (const name of SAMPLE_COLUMNS) {
    const col = request.columns[name];
    if (!col) continue;
    // The schema has checked every cell is a finite number.
    const packed = Float64Array.from(col as number[]);
    columns[name] = packed;
    transfer.push(packed.buffer);
  }
  return { value: { ...request, columns: columns as PackedSamplesRequest["columns"] }, transfer };
}

export const BODY_KINDS = {
  "convert-samples": (body: unknown) => packSamples(validateBody(body, samplesRequestSchema)),
} as const;

export type BodyKind = keyof typeof BODY_KINDS;
export type BodyValue<K extends BodyKind> = ReturnType<(typeof BODY_KINDS)[K]>["value"];

/** Bytes to the packed, validated value of one kind (throws the same 400s as the in-thread path). */
export function readBodyBytes<K extends BodyKind>(kind: K, bytes: Uint8Array): { value: BodyValue<K>; transfer: ArrayBuffer[] } {
  return BODY_KINDS[kind](decodeJson(bytes));
}
