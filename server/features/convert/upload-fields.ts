import type { Request } from "express";
import { ValidationError } from "../../errors.ts";

/**
 * Multipart uploads carry the CSV as the field `file` and the rest of the request as text fields;
 * these helpers turn them back into the JSON shape, so one zod schema judges both kinds of request.
 */

/** A text field as a value: JSON when asked for or when it looks like an object/array, else boolean, number or string. */
export function formField(req: Request, name: string, json = false): unknown {
  const raw: unknown = req.body?.[name];
  if (typeof raw !== "string") return raw;
  const t = raw.trim();
  if (t === "") return undefined;
  if (json || t.startsWith("{") || t.startsWith("[")) {
    try {
      return JSON.parse(t);
    } catch {
      throw new ValidationError(`Invalid ${name}: the form field must hold JSON`, { [name]: 'must be JSON text, e.g. {"m1": 10, ...}' });
    }
  }
  if (t === "true" || t === "false") return t === "true";
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

/** The uploaded CSV as text, or a 400 naming the field it should have come in. */
export function uploadedCsv(req: Request): string {
  const file = req.file;
  if (!file) throw new ValidationError("Invalid upload: attach the CSV as the form field file", { file: "attach the CSV as the form field file" });
  return file.buffer.toString("utf8");
}
