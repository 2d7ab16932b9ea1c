// The local mail service's messages (server/mail/routes.ts).
import { queryOptions } from "@tanstack/react-query";
import type { OutboxMessage } from "../../../shared/schemas/report";
import { http } from "../../api/http";

export const outboxQueries = {
  all: () => ["outbox"] as const,
  list: () =>
    queryOptions({
      queryKey: [...outboxQueries.all(), "list"] as const,
      queryFn: async ({ signal }) => (await http.get<{ messages: OutboxMessage[] }>("/api/outbox", signal)).messages,
      staleTime: 5_000,
    }),
};

export function attachmentUrl(messageId: number, index: number): string {
  return `/api/outbox/${messageId}/attachment/${index}`;
}
