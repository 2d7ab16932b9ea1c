// Multipart uploads with progress. fetch() cannot report upload progress, so big import files go through
// XMLHttpRequest; the CSRF handling and error shape are the same as in http.ts.
import { ApiError, fallbackMessage, getCsrfToken, isCsrfFailure, refreshCsrfToken, toApiError } from "./http";

export interface UploadProgress {
  loaded: number;
  total: number;
  /** 0–1, or null while the browser does not know the total size. */
  fraction: number | null;
}

export interface UploadOptions {
  method?: "POST" | "PUT";
  onProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
}

function parse(text: string): unknown {
  if (!text) return null;
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}

function sendOnce<T>(path: string, form: FormData, token: string, options: UploadOptions): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(options.method ?? "POST", path);
    xhr.withCredentials = false; // same-origin requests send cookies anyway
    xhr.setRequestHeader("accept", "application/json");
    xhr.setRequestHeader("x-csrf-token", token);
    xhr.upload.onprogress = (event) => {
      options.onProgress?.({
        loaded: event.loaded,
        total: event.total,
        fraction: event.lengthComputable && event.total > 0 ? event.loaded / event.total : null,
      });
    };
    xhr.onload = () => {
      const body = parse(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) resolve((xhr.status === 204 ? undefined : body) as T);
      else reject(toApiError(xhr.status, body));
    };
    xhr.onerror = () => reject(new ApiError(0, "network", "The upload did not reach the server. Check the connection and try again."));
    xhr.onabort = () => reject(new ApiError(0, "aborted", "Upload cancelled."));
    xhr.ontimeout = () => reject(new ApiError(0, "timeout", fallbackMessage(0)));
    if (options.signal) {
      if (options.signal.aborted) return reject(new ApiError(0, "aborted", "Upload cancelled."));
      options.signal.addEventListener("abort", () => xhr.abort(), { once: true });
    }
    xhr.send(form);
  });
}

/** Uploads a FormData (files and fields) and returns the server's JSON answer. */
export async function upload<T>(path: string, form: FormData, options: UploadOptions = {}): Promise<T> {
  const token = getCsrfToken() ?? (await refreshCsrfToken());
  try {
    return await sendOnce<T>(path, form, token, options);
  } catch (error) {
    if (!isCsrfFailure(error)) throw error;
    return sendOnce<T>(path, form, await refreshCsrfToken(), options);
  }
}
