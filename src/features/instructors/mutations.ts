// Instructor administration (coordinator only). Site counts and user links depend on instructors, so the
// site and user lists refresh too.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { z } from "zod";
import type { InstructorRow, newInstructorSchema, updateInstructorSchema } from "../../../shared/schemas/sites";
import { http } from "../../api/http";
import { siteQueries } from "../sites/queries";
import { userQueries } from "../users/queries";
import { instructorQueries } from "./queries";

function useInvalidateInstructors() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: instructorQueries.all() }),
      queryClient.invalidateQueries({ queryKey: siteQueries.all() }),
      queryClient.invalidateQueries({ queryKey: userQueries.all() }),
    ]);
}

export function useCreateInstructor() {
  const invalidate = useInvalidateInstructors();
  return useMutation({
    mutationFn: (instructor: z.infer<typeof newInstructorSchema>) => http.post<{ instructor: InstructorRow }>("/api/instructors", instructor),
    onSuccess: invalidate,
  });
}

export function useUpdateInstructor() {
  const invalidate = useInvalidateInstructors();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: z.infer<typeof updateInstructorSchema> }) =>
      http.patch<{ instructor: InstructorRow }>(`/api/instructors/${id}`, changes),
    onSuccess: invalidate,
  });
}
