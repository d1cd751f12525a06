/**
 * File uploads (multer, memory storage): one file in one named field, a size limit, and every
 * multer failure turned into the app's error shape (413 over the limit, 400 otherwise). The
 * file never touches the disk, so there are no file names to generate or clean up.
 */
import type { RequestHandler } from "express";
import multer from "multer";
import { AppError } from "../lib/app-error";

export interface SingleFileOptions {
  /** The multipart field that carries the file. */
  field: string;
  maxBytes: number;
  /** Plain words for the size limit in messages, e.g. "5 MB". */
  maxLabel: string;
}

/** Accepts exactly one file in `field` (req.file); no other files, at most a few small text fields. */
export function singleFileUpload(options: SingleFileOptions): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: options.maxBytes, files: 1, fields: 5, fieldSize: 1024, parts: 6, headerPairs: 50 },
  }).single(options.field);
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === "LIMIT_FILE_SIZE") {
          return next(
            new AppError(
              413,
              "file_too_large",
              `The file is larger than ${options.maxLabel}. Split it into smaller files and upload each.`,
              {
                [options.field]: `larger than ${options.maxLabel}`,
              },
            ),
          );
        }
        if (err.code === "LIMIT_UNEXPECTED_FILE") {
          return next(
            new AppError(400, "unexpected_file", `Send one file, in the form field "${options.field}".`, {
              [err.field ?? options.field]: `send the file in the field "${options.field}"`,
            }),
          );
        }
        return next(
          new AppError(
            400,
            "upload_invalid",
            `The upload could not be read (${err.message}). Send one file in the field "${options.field}".`,
          ),
        );
      }
      // Malformed multipart bodies (busboy) are the client's fault, never a 500.
      return next(
        new AppError(
          400,
          "upload_invalid",
          `The upload could not be read. Send one file in the form field "${options.field}".`,
        ),
      );
    });
  };
}
