// The web import API (server/imports/routes.ts) as TanStack Query options and plain calls. Answers are
// checked against the shared schemas the server builds them from.
import { infiniteQueryOptions, queryOptions } from "@tanstack/react-query";
import type { z } from "zod";
import type { ImportKind } from "../../../shared/domain";
import {
  batchDetailResponseSchema,
  batchListResponseSchema,
  finishedJobStatuses,
  formatsResponseSchema,
  jobResponseSchema,
  presetListResponseSchema,
  type ImportBatch,
  type ImportJob,
  type ImportPreset,
  type Preview,
  type Upload,
} from "../../../shared/import/api";
import type { ImportMapping } from "../../../shared/import/mapping";
import { getParsed } from "../../api/getParsed";
import { http } from "../../api/http";
import { upload, type UploadProgress } from "../../api/upload";

export type FormatColumn = z.infer<typeof formatsResponseSchema>["formats"][ImportKind][number];
export type BatchDetail = z.infer<typeof batchDetailResponseSchema>;
export type RejectedRow = BatchDetail["rejectedRows"][number];

export const HISTORY_PAGE_SIZE = 25;

export const importQueries = {
  all: () => ["imports"] as const,
  formats: () =>
    queryOptions({
      queryKey: [...importQueries.all(), "formats"] as const,
      queryFn: async ({ signal }) => (await getParsed(formatsResponseSchema, "/api/imports/formats", signal)).formats,
      staleTime: Infinity,
    }),
  presets: (kind: ImportKind) =>
    queryOptions({
      queryKey: [...importQueries.all(), "presets", kind] as const,
      queryFn: async ({ signal }) => (await getParsed(presetListResponseSchema, `/api/imports/presets?kind=${kind}`, signal)).presets,
    }),
  history: () =>
    infiniteQueryOptions({
      queryKey: [...importQueries.all(), "batches"] as const,
      queryFn: ({ pageParam, signal }) => getParsed(batchListResponseSchema, `/api/imports/batches?limit=${HISTORY_PAGE_SIZE}&offset=${pageParam}`, signal),
      initialPageParam: 0,
      getNextPageParam: (last, pages) => {
        const loaded = pages.reduce((sum, page) => sum + page.batches.length, 0);
        return loaded < last.total ? loaded : undefined;
      },
    }),
  batch: (id: number) =>
    queryOptions({
      queryKey: [...importQueries.all(), "batch", id] as const,
      queryFn: ({ signal }) => getParsed(batchDetailResponseSchema, `/api/imports/batches/${id}`, signal),
    }),
  job: (id: string) =>
    queryOptions({
      queryKey: [...importQueries.all(), "job", id] as const,
      queryFn: async ({ signal }) => (await getParsed(jobResponseSchema, `/api/imports/jobs/${id}`, signal)).job,
      // Poll while the job works; stop once it has an answer (done, failed, or cut short by a server restart).
      refetchInterval: (query) => (query.state.data && finishedJobStatuses.includes(query.state.data.status) ? false : 400),
      staleTime: 0,
    }),
};

export function uploadImportFile(kind: ImportKind, file: File, onProgress: (progress: UploadProgress) => void, signal: AbortSignal) {
  const form = new FormData();
  // The kind goes first: the server reads it before it accepts the file.
  form.append("kind", kind);
  form.append("file", file, file.name);
  return upload<{ upload: Upload; preview: Preview }>("/api/imports/uploads", form, { onProgress, signal });
}

export async function startJob(uploadId: string, mode: "validate" | "import", mapping: ImportMapping, skipInvalid: boolean): Promise<ImportJob> {
  return (await http.post<{ job: ImportJob }>(`/api/imports/uploads/${uploadId}/${mode}`, { mapping, skipInvalid })).job;
}

export async function savePreset(name: string, kind: ImportKind, mapping: ImportMapping): Promise<ImportPreset> {
  return (await http.post<{ preset: ImportPreset }>("/api/imports/presets", { name, kind, mapping })).preset;
}

export function deletePreset(id: number): Promise<void> {
  return http.delete<void>(`/api/imports/presets/${id}`);
}

export function undoBatch(id: number) {
  return http.post<{ batch: ImportBatch; deleted: number; restored: number }>(`/api/imports/batches/${id}/undo`);
}
