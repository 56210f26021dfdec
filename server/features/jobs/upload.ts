import { createHash, randomBytes } from "node:crypto";
import { createWriteStream } from "node:fs";
import { mkdir, open, unlink } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Request, RequestHandler } from "express";
import multer from "multer";
import type { Config } from "../../config.ts";
import { AppError } from "../../errors.ts";

/**
 * The samples upload: streamed to a temporary file while its SHA-256 is computed; busboy stops the
 * stream at the limit (signed-in or anonymous), and the partial file is removed. Nothing is parsed
 * here: the web process only moves bytes.
 */

export interface StoredUpload {
  path: string;
  size: number;
  sha256: string;
  originalname: string;
}

const UPLOAD_DIR = path.join(tmpdir(), "dragoman-uploads");

class HashingDiskStorage implements multer.StorageEngine {
  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<Express.Multer.File> & { sha256?: string }) => void): void {
    const target = path.join(UPLOAD_DIR, randomBytes(12).toString("hex"));
    mkdir(UPLOAD_DIR, { recursive: true }).then(
      () => {
        const hash = createHash("sha256");
        let size = 0;
        const out = createWriteStream(target);
        file.stream.on("data", (c: Buffer) => {
          hash.update(c);
          size += c.length;
        });
        file.stream.on("error", (err) => {
          out.destroy();
          void unlink(target).catch(() => undefined);
          cb(err);
        });
        out.on("error", cb);
        out.on("finish", () => cb(null, { path: target, size, sha256: hash.digest("hex") }));
        file.stream.pipe(out);
      },
      (err: unknown) => cb(err),
    );
  }
  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void): void {
    unlink(file.path).then(
      () => cb(null),
      () => cb(null),
    );
  }
}

export function maxUploadBytes(config: Config, req: Request): number {
  return req.identity ? config.JOBS_MAX_BYTES : config.JOBS_ANON_MAX_BYTES;
}

/** multer with the caller's limit; a file over it answers 413 naming the file and the limit. */
export function samplesUpload(config: Config): RequestHandler {
  const storage = new HashingDiskStorage();
  const make = (bytes: number) => multer({ storage, limits: { fileSize: bytes, files: 1, fields: 4, fieldSize: 1 << 20 } }).single("file");
  const signedIn = make(config.JOBS_MAX_BYTES);
  const anonymous = make(config.JOBS_ANON_MAX_BYTES);
  return (req, res, next) => {
    const limit = maxUploadBytes(config, req);
    (req.identity ? signedIn : anonymous)(req, res, (err?: unknown) => {
      if (err instanceof multer.MulterError && err.code === "LIMIT_FILE_SIZE") {
        const who = req.identity ? "" : " for anonymous jobs; sign in for larger files";
        next(new AppError(413, "file_too_large", `The file is over the limit of ${formatBytes(limit)}${who}.`, { file: `larger than ${formatBytes(limit)}` }));
        return;
      }
      next(err);
    });
  };
}

export function formatBytes(n: number): string {
  if (n >= 1 << 30) return `${(n / (1 << 30)).toPrecision(3)} GiB`;
  if (n >= 1 << 20) return `${(n / (1 << 20)).toPrecision(3)} MiB`;
  if (n >= 1 << 10) return `${(n / (1 << 10)).toPrecision(3)} KiB`;
  return `${n} bytes`;
}

export function storedUpload(req: Request): StoredUpload | null {
  const f = req.file as (Express.Multer.File & { sha256?: string }) | undefined;
  if (!f || !f.path || !f.sha256) return null;
  return { path: f.path, size: f.size, sha256: f.sha256, originalname: f.originalname };
}

/** text, json or hdf5, from the first bytes (HDF5 signature; "{" or "[" first). */
export async function sniffFormat(filePath: string): Promise<"text" | "json" | "hdf5"> {
  const fh = await open(filePath, "r");
  try {
    const buf = Buffer.alloc(512);
    const { bytesRead } = await fh.read(buf, 0, 512, 0);
    const head = buf.subarray(0, bytesRead);
    if (bytesRead >= 8 && head.subarray(0, 8).equals(Buffer.from([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]))) return "hdf5";
    const text = head.toString("utf8").replace(/^\uFEFF/, "").trimStart();
    if (text.startsWith("{") || text.startsWith("[")) return "json";
    return "text";
  } finally {
    await fh.close();
  }
}
