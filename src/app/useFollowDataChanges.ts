// Notices writes made elsewhere — a CLI import, another coordinator's upload — while a page is open: the
// server's data version is asked for when the tab becomes visible again, when the window regains focus (the
// query client listens to visibility only) and each minute while it is visible; when it differs from the one
// seen before, every figure query is refetched.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import { dataVersionQuery, invalidateFigures } from "./figureQueries";

const CHECK_EVERY_MS = 60_000;

export function useFollowDataChanges(): void {
  const queryClient = useQueryClient();
  const { data, refetch } = useQuery({
    ...dataVersionQuery.current(),
    staleTime: 0,
    refetchOnWindowFocus: "always",
    refetchOnReconnect: "always",
    refetchInterval: CHECK_EVERY_MS,
    refetchIntervalInBackground: false,
    // A missed check is harmless: the next focus asks again.
    retry: false,
  });
  useEffect(() => {
    const ask = () => void refetch();
    window.addEventListener("focus", ask);
    return () => window.removeEventListener("focus", ask);
  }, [refetch]);

  const seen = useRef<string | null>(null);
  useEffect(() => {
    if (!data) return;
    const before = seen.current;
    seen.current = data.version;
    if (before !== null && before !== data.version) void invalidateFigures(queryClient);
  }, [data, queryClient]);
}
