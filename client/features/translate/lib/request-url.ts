import { convertRequestSchema, DEFAULT_COSMOLOGY, type ConvertRequest } from "../../../../common/convert.ts";
import { readJsonParam } from "../../../lib/json-param.ts";

/**
 * A translation's inputs in the page address (?q=<the request as JSON>), so a link reproduces the
 * result: the request is read back through the same schema the server validates with, and a link
 * that no longer parses says which field is wrong instead of silently showing the example.
 */
export const REQUEST_PARAM = "q";
const STORAGE_KEY = "dragoman.translate.request";

export type UrlRequest = { kind: "none" } | { kind: "ok"; request: ConvertRequest; text: string } | { kind: "bad"; message: string };

export function readRequestParam(text: string | null): UrlRequest {
  const read = readJsonParam(convertRequestSchema, text);
  return read.kind === "ok" ? { kind: "ok", request: read.value, text: read.text } : read;
}

/** The request as the address carries it: the default cosmology (the server's, Planck 2018) is left out, so links stay short. */
export function requestParam(request: ConvertRequest): string {
  const { cosmology, ...rest } = request;
  const isDefault = !cosmology || (cosmology.H0 === DEFAULT_COSMOLOGY.H0 && cosmology.Omega_m === DEFAULT_COSMOLOGY.Omega_m);
  return JSON.stringify(isDefault ? rest : request);
}

/** What the form shows for a request: a link without a cosmology means the server's default, so the fields show it. */
export function formInitial(request: ConvertRequest): ConvertRequest {
  return { ...request, cosmology: request.cosmology ?? { ...DEFAULT_COSMOLOGY } };
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
