// One log line per request: method, the route as written (never the URL, whose path ids and query values
// may be personal), status, duration and the signed-in user's id. No headers, cookies, bodies or addresses.
import type { ErrorRequestHandler, Request, Response } from "express";
import { pinoHttp } from "pino-http";
import type { Logger } from "./logger";

/** "/api/users/:id" for a matched route; the client's catch-all is "(app shell)"; null when nothing matched. */
function routePattern(req: Request): string | null {
  if (!req.route) return null;
  const path: unknown = req.route.path;
  return typeof path === "string" ? `${req.baseUrl}${path}` : "(app shell)";
}

/**
 * An error leaves the router it happened in, and Express then resets req.baseUrl: note the pattern while it is
 * still whole. Mount this as the last error handler of every router that is mounted under a path.
 */
export const rememberRoute: ErrorRequestHandler = (err, req, res, next) => {
  res.locals.routePattern ??= routePattern(req);
  next(err);
};

function requestFields(req: Request, res: Response, durationMs: number) {
  const user = req.user as { id?: number } | undefined;
  return {
    method: req.method,
    route: (res.locals.routePattern as string | null | undefined) ?? routePattern(req),
    status: res.statusCode,
    durationMs,
    userId: user?.id ?? null,
  };
}

export function requestLog(logger: Logger) {
  return pinoHttp<Request, Response>({
    logger,
    // the request and response objects are never serialised: only the fields chosen above reach the log
    quietReqLogger: true,
    quietResLogger: true,
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? "error" : "info"),
    customSuccessObject: (req, res, fields) => requestFields(req, res, fields.responseTime as number),
    customErrorObject: (req, res, err, fields) => ({ ...requestFields(req, res, fields.responseTime as number), err }),
    customSuccessMessage: () => "request",
    customErrorMessage: () => "request failed",
  });
}
