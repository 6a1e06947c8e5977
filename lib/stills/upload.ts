import "server-only";
import crypto from "node:crypto";
import fs from "node:fs";
import fsp from "node:fs/promises";
import path from "node:path";
import { once } from "node:events";
import { Readable } from "node:stream";
import type { ReadableStream as NodeWebReadableStream } from "node:stream/web";
import busboy from "busboy";
import { AppError } from "@/lib/api/errors";
import { env } from "@/lib/env";
import { newIncomingPath } from "@/lib/stills/storage";

/** Room for the text fields and part headers around the file in a multipart body. */
const FORM_OVERHEAD = 64 * 1024;
/** The most body bytes an upload request may declare: the file limit plus the form around it. */
export const MAX_UPLOAD_BODY_BYTES = env.PLATEROOM_MAX_UPLOAD_BYTES + FORM_OVERHEAD;
const TEXT_FIELDS = ["alt", "caption", "credit", "technique", "role", "owner"] as const;

export type ReceivedFile = { path: string; sha256: string; size: number; originalName: string };
export type ReceivedUpload = { file: ReceivedFile; fields: Record<string, string> };

function limitMessage(maxBytes: number): string {
  return `The file is larger than ${formatMegabytes(maxBytes)}, the most Plateroom accepts.`;
}

function formatMegabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  return mb >= 1 ? `${Number.isInteger(mb) ? mb : mb.toFixed(1)} MB` : `${bytes} bytes`;
}

/** The uploader's own file name, kept for the record only: no folders, no control characters. */
export function cleanOriginalName(name: string | undefined): string {
  const base = path.basename((name ?? "").replace(/\\/g, "/"));
  return base.replace(/[\u0000-\u001f\u007f]/g, "").slice(0, 255);
}

/**
 * Receives one multipart upload (field `file` plus text fields) from the request body,
 * streaming the file to a temp file under the uploads folder while hashing it. The size
 * limit is enforced while streaming: the moment the count passes it, the body is abandoned,
 * the temp file removed, and AppError 413 thrown. A Content-Length that already says too
 * much is refused before reading. The caller owns the returned temp file.
 */
export async function receiveStillUpload(req: Request, options: { maxBytes?: number; root?: string } = {}): Promise<ReceivedUpload> {
  const maxBytes = options.maxBytes ?? env.PLATEROOM_MAX_UPLOAD_BYTES;
  const contentType = req.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data/i.test(contentType)) {
    throw new AppError("unsupported_type", "Send the still as multipart/form-data with a `file` field.");
  }
  const declared = Number(req.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > maxBytes + FORM_OVERHEAD) throw new AppError("too_large", limitMessage(maxBytes));
  if (!req.body) throw new AppError("validation_failed", "Choose a file to upload.", { fields: { file: "Choose a file to upload." } });

  const tempPath = await newIncomingPath(options.root);
  const source = Readable.fromWeb(req.body as unknown as NodeWebReadableStream<Uint8Array>);
  let parser: busboy.Busboy;
  try {
    parser = busboy({
      headers: { "content-type": contentType },
      // busboy flags a file that reaches fileSize, so allow one byte more and let our own count decide.
      limits: { files: 1, fileSize: maxBytes + 1, fields: TEXT_FIELDS.length + 4, fieldSize: 4096, parts: TEXT_FIELDS.length + 5 },
    });
  } catch (error) {
    throw new AppError("validation_failed", "The upload is not valid multipart form data.", { cause: error });
  }

  return new Promise<ReceivedUpload>((resolve, reject) => {
    const fields: Record<string, string> = {};
    let file: ReceivedFile | null = null;
    let fileDone: Promise<void> | null = null;
    let out: fs.WriteStream | null = null;
    let settled = false;

    const fail = (error: AppError) => {
      if (settled) return;
      settled = true;
      source.unpipe(parser);
      // Stop reading: destroying the Node stream cancels the request body.
      source.destroy();
      parser.removeAllListeners();
      parser.on("error", () => undefined);
      void (async () => {
        // Wait for the write stream to let go of its descriptor, or it could recreate the file after removal.
        if (out && !out.closed) {
          const closed = once(out, "close").catch(() => undefined);
          out.destroy();
          await closed;
        }
        await fsp.rm(tempPath, { force: true });
      })().finally(() => reject(error));
    };

    parser.on("field", (name, value, info) => {
      if (info.valueTruncated) return fail(new AppError("validation_failed", `The ${name} field is too long.`, { fields: { [name]: "Too long." } }));
      if ((TEXT_FIELDS as readonly string[]).includes(name)) fields[name] = value;
    });

    parser.on("file", (name, stream, info) => {
      if (name !== "file" || fileDone) {
        stream.resume();
        return fail(new AppError("validation_failed", "Send exactly one file, in the `file` field.", { fields: { file: "One file per upload." } }));
      }
      const hash = crypto.createHash("sha256");
      let size = 0;
      const sink = fs.createWriteStream(tempPath, { flags: "wx", mode: 0o600 });
      out = sink;
      fileDone = new Promise<void>((done, broken) => {
        stream.on("data", (chunk: Buffer) => {
          size += chunk.length;
          if (size > maxBytes) {
            stream.destroy();
            fail(new AppError("too_large", limitMessage(maxBytes)));
            return;
          }
          hash.update(chunk);
          if (!sink.write(chunk)) {
            stream.pause();
            sink.once("drain", () => stream.resume());
          }
        });
        stream.on("limit", () => fail(new AppError("too_large", limitMessage(maxBytes))));
        stream.on("end", () => sink.end());
        stream.on("error", broken);
        sink.on("error", broken);
        sink.on("close", () => {
          file = { path: tempPath, sha256: hash.digest("hex"), size, originalName: cleanOriginalName(info.filename) };
          done();
        });
      });
      fileDone.catch((error: unknown) => fail(new AppError("internal", undefined, { cause: error })));
    });

    parser.on("filesLimit", () => fail(new AppError("validation_failed", "Send exactly one file, in the `file` field.", { fields: { file: "One file per upload." } })));
    parser.on("partsLimit", () => fail(new AppError("validation_failed", "The upload has too many parts.")));
    parser.on("fieldsLimit", () => fail(new AppError("validation_failed", "The upload has too many fields.")));
    parser.on("error", (error) => fail(new AppError("validation_failed", "The upload is not valid multipart form data.", { cause: error })));
    source.on("error", (error) => fail(new AppError("validation_failed", "The upload was interrupted.", { cause: error })));

    parser.on("close", () => {
      void (async () => {
        if (settled) return;
        if (fileDone) await fileDone.catch(() => undefined);
        if (settled) return;
        if (!file) {
          return fail(new AppError("validation_failed", "Choose a file to upload.", { fields: { file: "Choose a file to upload." } }));
        }
        settled = true;
        resolve({ file, fields });
      })();
    });

    source.pipe(parser);
  });
}
