// The one way the client talks to the server: JSON in and out, same-origin cookies, and the CSRF header on
// every request that changes something. Errors arrive as { error: { code, message, details } } and leave
// as ApiError so pages can show the server's message beside the right field.
import { apiErrorCodes } from "../../shared/errorCodes";

const unsafeMethods = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** The CSRF token lives in memory only: it comes with each session answer and is never stored. */
let csrfToken: string | null = null;

export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

export function getCsrfToken(): string | null {
  return csrfToken;
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

/** Plain-language fallbacks for answers that carry no readable error body (proxies, crashes, time-outs). */
const fallbackMessages: Record<number, string> = {
  400: "The server could not read this request.",
  401: "Your session has ended. Sign in again.",
  403: "Your role may not do this.",
  404: "Not found. It may have been removed.",
  409: "This conflicts with something that already exists.",
  413: "The file is too large to upload.",
  422: "Some values are not valid.",
  429: "Too many attempts. Wait a minute and try again.",
};

export function fallbackMessage(status: number): string {
  return fallbackMessages[status] ?? `The server answered with an error (${status}). Try again in a moment.`;
}

/** Builds an ApiError from a parsed body (or none), accepting only the documented shape. */
export function toApiError(status: number, body: unknown): ApiError {
  const error = (body as { error?: { code?: unknown; message?: unknown; details?: unknown } } | null)?.error;
  const code = typeof error?.code === "string" ? error.code : `http_${status}`;
  const message = typeof error?.message === "string" && error.message ? error.message : fallbackMessage(status);
  return new ApiError(status, code, message, error?.details);
}

export function isCsrfFailure(error: unknown): boolean {
  return error instanceof ApiError && error.status === 403 && error.code === apiErrorCodes.csrf;
}

/** A token for a signed-out visitor (needed before signing in). */
export async function fetchSignedOutCsrfToken(): Promise<string> {
  const response = await fetch("/api/auth/csrf", { credentials: "same-origin", headers: { accept: "application/json" } });
  if (!response.ok) throw toApiError(response.status, await readJson(response));
  const body = (await response.json()) as { csrfToken: string };
  csrfToken = body.csrfToken;
  return body.csrfToken;
}

/** A fresh token: the session answer carries one when signed in; otherwise ask for a signed-out one. */
export async function refreshCsrfToken(): Promise<string> {
  const me = await fetch("/api/me", { credentials: "same-origin", headers: { accept: "application/json" } });
  if (me.ok) {
    const body = (await readJson(me)) as { csrfToken?: string } | null;
    if (body?.csrfToken) {
      csrfToken = body.csrfToken;
      return body.csrfToken;
    }
  }
  return fetchSignedOutCsrfToken();
}

async function readJson(response: Response): Promise<unknown> {
  const text = await response.text();
  if (!text) return null;
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}

export interface RequestOptions {
  method?: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  body?: unknown;
  signal?: AbortSignal;
}

async function send(path: string, options: RequestOptions): Promise<Response> {
  const method = options.method ?? "GET";
  const headers: Record<string, string> = { accept: "application/json" };
  if (options.body !== undefined) headers["content-type"] = "application/json";
  if (unsafeMethods.has(method)) headers["x-csrf-token"] = csrfToken ?? (await refreshCsrfToken());
  return fetch(path, {
    method,
    headers,
    credentials: "same-origin",
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
    signal: options.signal,
  });
}

/**
 * Sends a request and returns the parsed JSON answer (undefined for 204). A 403 "csrf" answer means the
 * token went stale (new session, server restart): fetch a fresh one and retry once.
 */
export async function request<T>(path: string, options: RequestOptions = {}): Promise<T> {
  let response = await send(path, options);
  if (response.status === 403 && unsafeMethods.has(options.method ?? "GET")) {
    const body = await readJson(response);
    const error = toApiError(403, body);
    if (!isCsrfFailure(error)) throw error;
    await refreshCsrfToken();
    response = await send(path, options);
  }
  if (!response.ok) throw toApiError(response.status, await readJson(response));
  if (response.status === 204) return undefined as T;
  return (await readJson(response)) as T;
}

export const http = {
  get: <T>(path: string, signal?: AbortSignal) => request<T>(path, { signal }),
  post: <T>(path: string, body?: unknown) => request<T>(path, { method: "POST", body }),
  patch: <T>(path: string, body: unknown) => request<T>(path, { method: "PATCH", body }),
  put: <T>(path: string, body: unknown) => request<T>(path, { method: "PUT", body }),
  delete: <T>(path: string) => request<T>(path, { method: "DELETE" }),
};
