import type { Request, Response } from "express";
import multer from "multer";
import { HttpError } from "../errors";
import { formatBytes } from "../../shared/schemas/attachment";

/**
 * Receives a multipart body into memory (multer) and turns its limit errors into plain messages:
 * too large or too many files → 413, a file under another field name → 400.
 */
export function receiveFiles(opts: { field: string; maxFiles: number; maxBytes: number }) {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: opts.maxBytes, files: opts.maxFiles, fields: 20, fieldSize: 8 * 1024, parts: opts.maxFiles + 20 },
    defParamCharset: "utf8", // file names as the browser sent them (UTF-8), not Latin-1
  }).array(opts.field, opts.maxFiles);

  return (req: Request, res: Response): Promise<Express.Multer.File[]> =>
    new Promise((resolve, reject) => {
      upload(req, res, (err: unknown) => {
        if (!err) return resolve((req.files as Express.Multer.File[] | undefined) ?? []);
        if (err instanceof multer.MulterError) {
          switch (err.code) {
            case "LIMIT_FILE_SIZE":
              return reject(new HttpError(413, "file_too_large", `Each file may be at most ${formatBytes(opts.maxBytes)}; nothing was uploaded`));
            case "LIMIT_FILE_COUNT":
            case "LIMIT_UNEXPECTED_FILE":
              if (err.code === "LIMIT_FILE_COUNT" || err.field === opts.field) {
                return reject(new HttpError(413, "too_many_files", `At most ${opts.maxFiles} ${opts.maxFiles === 1 ? "file" : "files"} per upload; nothing was uploaded`));
              }
              return reject(new HttpError(400, "upload", `Send the file in the field "${opts.field}"`));
            case "LIMIT_PART_COUNT":
            case "LIMIT_FIELD_COUNT":
            case "LIMIT_FIELD_VALUE":
            case "LIMIT_FIELD_KEY":
              return reject(new HttpError(413, "too_large", "The upload has too many or too long form fields"));
            default:
              return reject(new HttpError(400, "upload", err.message));
          }
        }
        reject(err);
      });
    });
}
