// The machine codes of the API's error answers ({ error: { code, message, details } }) that the client
// acts on or that tests stand in for. The server builds its errors with these and the client compares with
// them, so a renamed code changes both sides at once.
export const apiErrorCodes = {
  badRequest: "bad_request",
  /** Not signed in, or the session ended. */
  unauthorized: "unauthorized",
  /** A wrong e-mail or password on the sign-in form (also a 401, but not an ended session). */
  invalidCredentials: "invalid_credentials",
  forbidden: "forbidden",
  /** The form's CSRF token is missing or out of date. */
  csrf: "csrf",
  notFound: "not_found",
  conflict: "conflict",
  /** A payload that does not fit its schema; details name the fields. */
  invalid: "invalid",
  tooLarge: "too_large",
  /** An upload whose file was removed (kept hours over, or the server restarted): upload it again. */
  uploadGone: "upload_gone",
  internal: "internal",
} as const;

export type ApiErrorCode = (typeof apiErrorCodes)[keyof typeof apiErrorCodes];

/** What the server says to a signed-out request for a page that needs a session. */
export const signInFirstMessage = "Sign in first.";
