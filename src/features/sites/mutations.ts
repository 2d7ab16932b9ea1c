// Site administration (coordinator only). Sites carry instructor counts and instructors carry site codes,
// so a change to either refreshes both lists.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { z } from "zod";
import type { NewSite, SiteRow, updateSiteSchema } from "../../../shared/schemas/sites";
import { http } from "../../api/http";
import { instructorQueries } from "../instructors/queries";
import { siteQueries } from "./queries";

export function useInvalidateSitesAndInstructors() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([queryClient.invalidateQueries({ queryKey: siteQueries.all() }), queryClient.invalidateQueries({ queryKey: instructorQueries.all() })]);
}

export function useCreateSite() {
  const invalidate = useInvalidateSitesAndInstructors();
  return useMutation({
    mutationFn: (site: NewSite) => http.post<{ site: SiteRow }>("/api/sites", site),
    onSuccess: invalidate,
  });
}

export function useUpdateSite() {
  const invalidate = useInvalidateSitesAndInstructors();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: z.infer<typeof updateSiteSchema> }) => http.patch<{ site: SiteRow }>(`/api/sites/${id}`, changes),
    onSuccess: invalidate,
  });
}
