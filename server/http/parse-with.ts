import type { z } from "zod";
import { ValidationError, type FieldErrors } from "../errors.ts";

/** Parse with a zod schema; a failure becomes a 400 whose fields name each offending path. */
export function parseWith<S extends z.ZodType>(schema: S, value: unknown, what = "request body"): z.output<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const fields: FieldErrors = {};
  for (const issue of result.error.issues) {
    if (issue.code === "unrecognized_keys") {
      // Strict schemas: each unknown field is named by its own path, so a typo is never silently dropped.
      for (const name of issue.keys) {
        const key = [...issue.path.map(String), name].join(".");
        fields[key] ??= `unknown field "${name}": this request does not take it`;
      }
      continue;
    }
    const key = issue.path.map(String).join(".") || what;
    fields[key] ??= issue.message;
  }
  const first = Object.entries(fields)[0];
  throw new ValidationError(first ? `Invalid ${what}: ${first[0]}: ${first[1]}` : `Invalid ${what}`, fields);
}
