import type { z } from "zod";
import { AppError } from "../errors.ts";
import { parseWith } from "./parse-with.ts";
import { bodyTextProblem } from "./text-guard.ts";

/**
 * A JSON body from its bytes to its validated value, the steps express.json, the text guard and
 * parseWith take, in the same order and with the same answers: empty is {}, the top level must be an
 * object or an array, malformed JSON is 400 malformed_json, text no column could hold is 400 naming
 * its path, and the schema's 400 names each offending field. No Express here: worker threads run it.
 */

const malformed = () => new AppError(400, "malformed_json", "The request body is not valid JSON.", { body: "not valid JSON" });

/** UTF-8 bytes to a value (a byte-order mark is dropped, invalid sequences become U+FFFD, as body-parser reads them). */
export function decodeJson(bytes: Uint8Array): unknown {
  if (bytes.length === 0) return {};
  const text = new TextDecoder("utf-8").decode(bytes);
  const first = /^[ \t\n\r]*(.)/.exec(text)?.[1];
  if (first !== "{" && first !== "[") throw malformed();
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw malformed();
  }
}

export function parseJsonBytes<S extends z.ZodType>(bytes: Uint8Array, schema: S, what?: string): z.output<S> {
  return validateBody(decodeJson(bytes), schema, what);
}

/** A parsed body through the text guard and the schema. */
export function validateBody<S extends z.ZodType>(body: unknown, schema: S, what?: string): z.output<S> {
  const problem = bodyTextProblem(body);
  if (problem) throw problem;
  return parseWith(schema, body, what);
}
