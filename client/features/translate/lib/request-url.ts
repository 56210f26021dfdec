import { convertRequestSchema, type ConvertRequest } from "../../../../common/convert.ts";

/**
 * A translation's inputs in the page address (?q=<the request as JSON>), so a link reproduces the
 * result: the request is read back through the same schema the server validates with, and a link
 * that no longer parses says which field is wrong instead of silently showing the example.
 */
export const REQUEST_PARAM = "q";
const STORAGE_KEY = "dragoman.translate.request";

export type UrlRequest = { kind: "none" } | { kind: "ok"; request: ConvertRequest; text: string } | { kind: "bad"; message: string };

export function readRequestParam(text: string | null): UrlRequest {
  if (text === null || text === "") return { kind: "none" };
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    return { kind: "bad", message: "the link's inputs are not readable (they are cut or altered)" };
  }
  const parsed = convertRequestSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { kind: "bad", message: issue ? `${issue.path.join(".") || "request"}: ${issue.message}` : "the link's inputs are not a valid request" };
  }
  return { kind: "ok", request: parsed.data, text };
}

export function requestParam(request: ConvertRequest): string {
  return JSON.stringify(request);
}

/** The last request of this browser tab, so leaving the page and coming back keeps the result. */
export function rememberRequest(text: string): void {
  try {
    sessionStorage.setItem(STORAGE_KEY, text);
  } catch {
    // Storage can be unavailable (private modes); the address still carries the request.
  }
}

export function rememberedRequest(): string | null {
  try {
    return sessionStorage.getItem(STORAGE_KEY);
  } catch {
    return null;
  }
}

/** The form's visible state, to tell whether the inputs changed since the shown result was made. */
export function formSnapshot(form: HTMLFormElement | null | undefined): string {
  if (!form) return "";
  const pairs: string[] = [];
  for (const el of Array.from(form.elements)) {
    if (!(el instanceof HTMLInputElement || el instanceof HTMLSelectElement || el instanceof HTMLTextAreaElement)) continue;
    if (el.type === "submit" || el.type === "button") continue;
    const value = el instanceof HTMLInputElement && (el.type === "checkbox" || el.type === "radio") ? String(el.checked) : el.value;
    pairs.push(`${el.name || el.id}=${value}`);
  }
  return pairs.join("&");
}
