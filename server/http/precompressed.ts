import { stat } from "node:fs/promises";
import path from "node:path";
import type { RequestHandler } from "express";

/**
 * Serves the `.br` / `.gz` files that the build writes beside each compressible hashed asset
 * (scripts/precompress.ts) to clients that accept that encoding: brotli first, then gzip, as
 * `Accept-Encoding` allows. The answer carries the original file's type, `Content-Encoding`,
 * `Vary: Accept-Encoding` and the same immutable caching as the plain file. A client that accepts
 * neither, a file without a precompressed twin, or anything but GET/HEAD falls through to the plain
 * file (which the compression middleware may still compress on the fly).
 *
 * Asset names carry a content hash, so whether a twin exists never changes for a name: the answer
 * of the one `stat` per name and encoding is remembered (bounded, so unknown names cannot grow it).
 */
const MAX_REMEMBERED = 4096;

/**
 * "br" or "gzip", whichever the header accepts with the higher weight (brotli on a tie: it is the
 * smaller), or undefined when it accepts neither. A missing header means no encoding (identity).
 * Browsers send "gzip, deflate, br, zstd": every weight 1, so brotli.
 */
export function preferredEncoding(header: string | undefined): "br" | "gzip" | undefined {
  if (header === undefined) return undefined;
  const weights = new Map<string, number>();
  for (const part of header.split(",")) {
    const [token, ...params] = part.trim().toLowerCase().split(";");
    if (!token) continue;
    let q = 1;
    for (const p of params) {
      const m = /^\s*q\s*=\s*([0-9.]+)\s*$/.exec(p);
      if (m) q = Number(m[1]);
    }
    if (Number.isFinite(q)) weights.set(token.trim(), q);
  }
  const weight = (name: string) => weights.get(name) ?? weights.get("*") ?? 0;
  const br = weight("br");
  const gzip = Math.max(weight("gzip"), weights.get("x-gzip") ?? 0);
  if (br <= 0 && gzip <= 0) return undefined;
  return br >= gzip ? "br" : "gzip";
}

export function precompressedAssets(dir: string, notFound: RequestHandler): RequestHandler {
  const root = path.resolve(dir);
  const known = new Map<string, boolean>();
  const exists = async (file: string): Promise<boolean> => {
    const hit = known.get(file);
    if (hit !== undefined) return hit;
    const found = await stat(file).then(
      (s) => s.isFile(),
      () => false,
    );
    if (known.size >= MAX_REMEMBERED) known.clear();
    known.set(file, found);
    return found;
  };

  return (req, res, next) => {
    if (req.method !== "GET" && req.method !== "HEAD") return next();
    let rel: string;
    try {
      rel = decodeURIComponent(req.path);
    } catch {
      return next();
    }
    const file = path.join(root, rel);
    // A twin asked for by name is not a file of its own (it would go out with the wrong type).
    if (/\.(br|gz)$/.test(file)) return notFound(req, res, next);
    // Only plain files directly under the assets folder: no traversal, no folders.
    if (path.dirname(file) !== root) return next();
    const encoding = preferredEncoding(req.headers["accept-encoding"]);
    if (encoding === undefined) return next();
    const suffix = encoding === "br" ? ".br" : ".gz";
    void exists(`${file}${suffix}`).then(
      (found) => {
        if (!found) return next();
        res.vary("Accept-Encoding");
        res.setHeader("Content-Encoding", encoding);
        // The type of the file itself (send would otherwise take it from ".br").
        res.type(path.extname(file));
        // Cached as the plain file is (a year, immutable); no ranges of an encoded body.
        res.sendFile(`${file}${suffix}`, { maxAge: "1y", immutable: true, acceptRanges: false }, (err?: Error) => {
          if (err === undefined) return;
          // Nothing sent yet (the twin vanished): the plain file answers instead.
          if (!res.headersSent) {
            res.removeHeader("Content-Encoding");
            res.removeHeader("Content-Type");
            known.delete(`${file}${suffix}`);
            return next();
          }
          next(err);
        });
      },
      (err: unknown) => next(err),
    );
  };
}
