import type { ErrorRequestHandler, RequestHandler } from "express";
import { apiErrorCodes } from "../../shared/errorCodes";
import { AppError } from "../errors";

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new AppError(apiErrorCodes.notFound, 404, `No API route ${req.method} ${req.path}.`));
};

/** Answers `{ error: { code, message, details } }`; never leaks stack traces or SQL to the client. */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof AppError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details, hint: err.hint } });
    return;
  }
  // body-parser and multer errors carry a status and a type of their own
  const status = typeof err?.status === "number" ? err.status : typeof err?.statusCode === "number" ? err.statusCode : 500;
  if (status === 413 || err?.code === "LIMIT_FILE_SIZE") {
    res.status(413).json({ error: { code: apiErrorCodes.tooLarge, message: "The upload is larger than the server accepts." } });
    return;
  }
  if (status >= 400 && status < 500) {
    res.status(status).json({ error: { code: apiErrorCodes.badRequest, message: "The request could not be read." } });
    return;
  }
  // the request's log line carries the error (message, stack) at level error
  res.err = err instanceof Error ? err : new Error(String(err));
  res.status(500).json({ error: { code: apiErrorCodes.internal, message: "Something went wrong on the server. It has been logged." } });
};
