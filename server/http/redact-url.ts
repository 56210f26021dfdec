/**
 * What a request log may say about a URL. Secrets that travel in URLs never reach the logs:
 * - share-link tokens (`/shared/<token>` in the page and the API paths) become `/shared/[redacted]`;
 * - on `/auth/*` the query string (the OAuth code and state) is dropped.
 */
export function redactUrl(url: string): string {
  const path = url.startsWith("/auth/") ? (url.split("?")[0] ?? url) : url;
  return path.replace(/\/shared\/[^/?#]+/g, "/shared/[redacted]");
}
