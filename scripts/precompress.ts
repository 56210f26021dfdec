import { readdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { brotliCompressSync, constants, gzipSync } from "node:zlib";

/**
 * Build-time compression of the client's hashed assets: next to every compressible file of
 * `dist/assets` (JavaScript, CSS, SVG, JSON, source maps, plain text) a `.br` (brotli, quality 11) and
 * a `.gz` (gzip, level 9), written only when they save at least a tenth of the file. The server sends
 * them as they are (server/http/precompressed.ts), so no request pays for compressing a static file
 * and the files are smaller than the on-the-fly middleware's (brotli quality 4) would make them.
 * Fonts (woff2 is compressed already), images and anything under 1 kB are left alone.
 */
export const PRECOMPRESSED_TYPES = /\.(js|mjs|css|svg|json|map|txt|html)$/;
const MIN_BYTES = 1024;
const MAX_RATIO = 0.9;

export interface PrecompressReport {
  readonly files: number;
  readonly bytes: number;
  readonly brotliBytes: number;
  readonly gzipBytes: number;
}

export function precompressDir(dir: string): PrecompressReport {
  let files = 0;
  let bytes = 0;
  let brotliBytes = 0;
  let gzipBytes = 0;
  for (const name of readdirSync(dir)) {
    const file = path.join(dir, name);
    if (!PRECOMPRESSED_TYPES.test(name) || !statSync(file).isFile()) continue;
    const data = readFileSync(file);
    if (data.length < MIN_BYTES) continue;
    const br = brotliCompressSync(data, {
      params: { [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY, [constants.BROTLI_PARAM_SIZE_HINT]: data.length },
    });
    const gz = gzipSync(data, { level: 9 });
    let wrote = false;
    if (br.length <= data.length * MAX_RATIO) {
      writeFileSync(`${file}.br`, br);
      brotliBytes += br.length;
      wrote = true;
    }
    if (gz.length <= data.length * MAX_RATIO) {
      writeFileSync(`${file}.gz`, gz);
      gzipBytes += gz.length;
      wrote = true;
    }
    if (wrote) {
      files += 1;
      bytes += data.length;
    }
  }
  return { files, bytes, brotliBytes, gzipBytes };
}

/** The Vite plugin (vite.config.ts): precompresses `<outDir>/assets` once the bundle is written. */
export function precompressAssets(): { name: string; apply: "build"; writeBundle: (options: { dir?: string }) => void } {
  return {
    name: "dragoman-precompress",
    apply: "build",
    writeBundle(options) {
      const dir = path.join(options.dir ?? "dist", "assets");
      const r = precompressDir(dir);
      const kB = (n: number) => `${(n / 1024).toFixed(0)} kB`;
      process.stdout.write(`precompressed ${r.files} assets: ${kB(r.bytes)} -> ${kB(r.brotliBytes)} brotli, ${kB(r.gzipBytes)} gzip\n`);
    },
  };
}
