/**
 * Where to send someone after sign-in. Only a path on this site: starts with one "/", not "//" or
 * "/\" (browsers read those as another host), no control characters. Anything else becomes "/".
 */
export function safeReturnPath(value: unknown): string {
  if (typeof value !== "string" || value.length === 0 || value.length > 2000) return "/";
  if (!value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return "/";
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f\\]/.test(value)) return "/";
  try {
    const u = new URL(value, "http://same.invalid");
    if (u.origin !== "http://same.invalid") return "/";
    return u.pathname + u.search + u.hash;
  } catch {
    return "/";
  }
}
