import type { Request } from "express";
import { BODY_KINDS, readBodyBytes, type BodyKind, type BodyValue } from "./body-kinds.ts";
import { getBodyPool } from "./body-pool.ts";

/** Bodies up to this size are read on the request thread (well under a millisecond); larger ones in the body worker. */
export const IN_THREAD_MAX_BYTES = 64 * 1024;

/**
 * The JSON body of a route declared with `rawJsonBody` (req.body holds its bytes), parsed and
 * validated as `kind`: on this thread when small, in the body worker thread (body-pool.ts) when
 * large, with the same 400s either way. A request that is not JSON (no body, another content type)
 * leaves req.body as its parsers left it, and that value is validated here, as before.
 */
export async function readJsonBody<K extends BodyKind>(req: Request, kind: K): Promise<BodyValue<K>> {
  const raw: unknown = req.body;
  if (!Buffer.isBuffer(raw)) return BODY_KINDS[kind](raw).value as BodyValue<K>;
  if (raw.length <= IN_THREAD_MAX_BYTES) return readBodyBytes(kind, raw).value;
  // Hand the memory over when the Buffer owns all of it (large reads do); else one copy.
  const owns = raw.byteOffset === 0 && raw.byteLength === raw.buffer.byteLength && raw.buffer instanceof ArrayBuffer;
  const bytes = owns ? (raw.buffer as ArrayBuffer) : raw.buffer.slice(raw.byteOffset, raw.byteOffset + raw.byteLength);
  req.body = undefined;
  return getBodyPool().read(kind, bytes as ArrayBuffer);
}
