// The funder report API (server/reports/routes.ts) as TanStack Query options.
import { queryOptions } from "@tanstack/react-query";
import type { ReleaseOutcome, ReportData, ReportSendRow, ReportVersion } from "../../../shared/schemas/report";
import { userListAnswerSchema } from "../../../shared/schemas/users";
import { getParsed } from "../../api/getParsed";
import { http } from "../../api/http";

export const reportQueries = {
  all: () => ["report"] as const,
  /** The report as a new version would show it now. */
  preview: (period: string) =>
    queryOptions({
      queryKey: [...reportQueries.all(), "preview", period] as const,
      queryFn: async ({ signal }) => (await http.get<{ report: ReportData }>(`/api/reports/${period}/preview`, signal)).report,
    }),
  /** Every stored version the reader may see (for funders: the released ones), newest first. */
  allVersions: () =>
    queryOptions({
      queryKey: [...reportQueries.all(), "versions"] as const,
      queryFn: async ({ signal }) => (await http.get<{ reports: ReportVersion[] }>("/api/reports", signal)).reports,
    }),
  versions: (period: string) =>
    queryOptions({
      queryKey: [...reportQueries.all(), "versions", period] as const,
      queryFn: async ({ signal }) => (await http.get<{ reports: ReportVersion[] }>(`/api/reports?period=${encodeURIComponent(period)}`, signal)).reports,
    }),
  /** A stored version's figures: exactly what its PDF shows. */
  versionData: (id: number) =>
    queryOptions({
      queryKey: [...reportQueries.all(), "version", id] as const,
      queryFn: ({ signal }) => http.get<{ report: ReportVersion; data: ReportData }>(`/api/reports/${id}/data`, signal),
      staleTime: Infinity,
    }),
  notes: (period: string) =>
    queryOptions({
      queryKey: [...reportQueries.all(), "notes", period] as const,
      queryFn: async ({ signal }) => (await http.get<{ period: string; actions: string }>(`/api/reports/${period}/notes`, signal)).actions,
    }),
  sends: () =>
    queryOptions({
      queryKey: [...reportQueries.all(), "sends"] as const,
      queryFn: async ({ signal }) => (await http.get<{ sends: ReportSendRow[] }>("/api/report-sends", signal)).sends,
    }),
  /** Active funder accounts: who "Send to funders" reaches (coordinators may list users). */
  funders: () =>
    queryOptions({
      queryKey: [...reportQueries.all(), "funders"] as const,
      queryFn: async ({ signal }) =>
        // the role here is the data asked for (who receives the report), not a permission check
        (await getParsed(userListAnswerSchema, "/api/users", signal)).users.filter((u) => u.role === "funder" && u.active).map((u) => u.email),
    }),
};

export const pdfUrl = (id: number) => `/api/reports/${id}/pdf`;
/** The same PDF, answered to be shown inside the page rather than downloaded. */
export const pdfPreviewUrl = (id: number) => `/api/reports/${id}/pdf?inline=1`;
export const csvUrl = (id: number) => `/api/reports/${id}/csv`;

export function saveNotes(period: string, actions: string) {
  return http.put<{ period: string; actions: string }>(`/api/reports/${period}/notes`, { actions });
}

export async function createVersion(period: string, includeActions = false): Promise<ReportVersion> {
  return (await http.post<{ report: ReportVersion }>(`/api/reports/${period}`, { includeActions })).report;
}

export async function sendVersion(id: number, coverNote: string, extraRecipients: string[]): Promise<ReportSendRow> {
  return (await http.post<{ send: ReportSendRow }>(`/api/reports/${id}/send`, { coverNote, extraRecipients })).send;
}

export function releaseVersion(id: number): Promise<ReleaseOutcome> {
  return http.post<ReleaseOutcome>(`/api/reports/${id}/release`);
}

export async function retrySend(id: number): Promise<ReportSendRow> {
  return (await http.post<{ send: ReportSendRow }>(`/api/report-sends/${id}/retry`)).send;
}
