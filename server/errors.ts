// One error type for the whole server and CLI: a machine code, an HTTP status, a message for people and,
// where it helps, a hint saying what to do next.
import type { ZodError } from "zod";
import { apiErrorCodes, signInFirstMessage } from "../shared/errorCodes";

export class AppError extends Error {
  constructor(
    readonly code: string,
    readonly status: number,
    message: string,
    readonly details?: unknown,
    readonly hint?: string,
  ) {
    super(message);
    this.name = "AppError";
  }
}

export const badRequest = (message: string, details?: unknown) => new AppError(apiErrorCodes.badRequest, 400, message, details);
export const unauthorized = (message = signInFirstMessage) => new AppError(apiErrorCodes.unauthorized, 401, message);
export const forbidden = (message = "Your role does not allow this.") => new AppError(apiErrorCodes.forbidden, 403, message);
export const notFound = (what = "That item") => new AppError(apiErrorCodes.notFound, 404, `${what} was not found.`);
export const conflict = (message: string, details?: unknown) => new AppError(apiErrorCodes.conflict, 409, message, details);

/** Zod issues as `{ path, message }` pairs: what forms show beside their fields. */
export function validationError(error: ZodError, what = "The request") {
  const details = error.issues.map((issue) => ({ path: issue.path.join("."), message: issue.message }));
  return new AppError(apiErrorCodes.invalid, 422, `${what} is not valid.`, details);
}
