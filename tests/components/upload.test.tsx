import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { setCsrfToken } from "../../src/api/http";
import { upload, type UploadProgress } from "../../src/api/upload";
import { fakeServer, sessionFor } from "./testServer";

/** A scripted XMLHttpRequest: each send() is answered by the next entry of `answers`. */
class ScriptedXhr {
  static answers: { status: number; body: unknown }[] = [];
  static sent: { method: string; url: string; headers: Record<string, string>; body: unknown }[] = [];
  status = 0;
  responseText = "";
  withCredentials = false;
  upload: { onprogress: ((event: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  ontimeout: (() => void) | null = null;
  private method = "";
  private url = "";
  private headers: Record<string, string> = {};
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  abort() {
    this.onabort?.();
  }
  send(body: unknown) {
    ScriptedXhr.sent.push({ method: this.method, url: this.url, headers: this.headers, body });
    const answer = ScriptedXhr.answers.shift()!;
    queueMicrotask(() => {
      this.upload.onprogress?.({ loaded: 50, total: 100, lengthComputable: true });
      this.upload.onprogress?.({ loaded: 100, total: 100, lengthComputable: true });
      this.status = answer.status;
      this.responseText = JSON.stringify(answer.body);
      this.onload?.();
    });
  }
}

beforeEach(() => {
  ScriptedXhr.answers = [];
  ScriptedXhr.sent = [];
  vi.stubGlobal("XMLHttpRequest", ScriptedXhr);
  setCsrfToken(null);
});
afterEach(() => vi.unstubAllGlobals());

function form() {
  const data = new FormData();
  data.append("file", new Blob(["class_id,date\n"], { type: "text/csv" }), "classes.csv");
  return data;
}

describe("upload", () => {
  it("sends the form with the CSRF token and reports progress", async () => {
    setCsrfToken("token-a");
    ScriptedXhr.answers.push({ status: 201, body: { batchId: 9 } });
    const progress: UploadProgress[] = [];
    await expect(upload("/api/imports", form(), { onProgress: (p) => progress.push(p) })).resolves.toEqual({ batchId: 9 });
    expect(ScriptedXhr.sent[0]).toMatchObject({ method: "POST", url: "/api/imports", headers: { "x-csrf-token": "token-a" } });
    expect(ScriptedXhr.sent[0].body).toBeInstanceOf(FormData);
    expect(progress.map((p) => p.fraction)).toEqual([0.5, 1]);
  });

  it("refreshes a stale token once and sends again", async () => {
    fakeServer({ "GET /api/me": sessionFor("coordinator") });
    setCsrfToken("stale");
    ScriptedXhr.answers.push({ status: 403, body: { error: { code: "csrf", message: "Stale" } } }, { status: 201, body: { batchId: 10 } });
    await expect(upload("/api/imports", form())).resolves.toEqual({ batchId: 10 });
    expect(ScriptedXhr.sent.map((s) => s.headers["x-csrf-token"])).toEqual(["stale", "token-1"]);
  });

  it("turns a 413 into an ApiError with the server's message", async () => {
    setCsrfToken("token-a");
    ScriptedXhr.answers.push({ status: 413, body: { error: { code: "too_large", message: "The upload is larger than the server accepts." } } });
    await expect(upload("/api/imports", form())).rejects.toMatchObject({
      status: 413,
      code: "too_large",
      message: "The upload is larger than the server accepts.",
    });
  });

  it("refuses at once when already cancelled", async () => {
    setCsrfToken("token-a");
    const controller = new AbortController();
    controller.abort();
    await expect(upload("/api/imports", form(), { signal: controller.signal })).rejects.toMatchObject({ code: "aborted" });
    expect(ScriptedXhr.sent).toHaveLength(0);
  });
});
