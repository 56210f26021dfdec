import type { z } from "zod";

/**
 * A page's inputs kept in its address as JSON (?q=...), so a link reproduces the result. The text is
 * read back through the same schema the server validates with; a link that no longer parses says
 * which field is wrong instead of silently showing the example.
 */
export type JsonParam<T> = { kind: "none" } | { kind: "ok"; value: T; text: string } | { kind: "bad"; message: string };

export function readJsonParam<S extends z.ZodType>(schema: S, text: string | null, what = "request"): JsonParam<z.output<S>> {
  if (text === null || text === "") return { kind: "none" };
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    return { kind: "bad", message: "the link's inputs are not readable (they are cut or altered)" };
  }
  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { kind: "bad", message: issue ? `${issue.path.join(".") || what}: ${issue.message}` : `the link's inputs are not a valid ${what}` };
  }
  return { kind: "ok", value: parsed.data, text };
}
