// Account administration (coordinator only). Every change refreshes the user list.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { SessionAnswer } from "../../../shared/schemas/auth";
import type { NewUser, UpdateUser, UserRow } from "../../../shared/schemas/users";
import { http, setCsrfToken } from "../../api/http";
import { userQueries } from "./queries";

function useInvalidateUsers() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: userQueries.all() });
}

export function useCreateUser() {
  const invalidate = useInvalidateUsers();
  return useMutation({
    mutationFn: (user: NewUser) => http.post<{ user: UserRow }>("/api/users", user),
    onSuccess: invalidate,
  });
}

export function useUpdateUser() {
  const invalidate = useInvalidateUsers();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: UpdateUser }) => http.patch<{ user: UserRow }>(`/api/users/${id}`, changes),
    onSuccess: invalidate,
  });
}

export function useResetUserPassword() {
  return useMutation({
    mutationFn: ({ id, password }: { id: number; password: string }) => http.post<SessionAnswer | undefined>(`/api/users/${id}/password`, { password }),
    // resetting one's own password gives this session a new id, and with it a new token
    onSuccess: (answer) => {
      if (answer) setCsrfToken(answer.csrfToken);
    },
  });
}
