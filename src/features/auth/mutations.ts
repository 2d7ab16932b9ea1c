// Sign-in, sign-out and "my account" changes. Each writes the new session answer straight into the cache so
// the header, guards and pages update at once.
import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ChangePassword, CurrentUser, SessionAnswer, SignIn } from "../../../shared/schemas/auth";
import type { LengthUnit } from "../../../shared/units";
import { fetchSignedOutCsrfToken, http, setCsrfToken } from "../../api/http";
import { authQueries } from "./queries";

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (credentials: SignIn) => {
      await fetchSignedOutCsrfToken(); // a signed-out visitor needs a token before the first POST
      return http.post<SessionAnswer>("/api/auth/login", credentials);
    },
    onSuccess: (answer) => {
      setCsrfToken(answer.csrfToken); // the session changed, so did the token
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authQueries.all()[0] });
      queryClient.setQueryData(authQueries.me().queryKey, answer);
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => http.post<void>("/api/auth/logout"),
    onSettled: () => {
      setCsrfToken(null);
      // Drop every cached answer: the next user of this browser must not see the last one's data.
      queryClient.clear();
      queryClient.setQueryData(authQueries.me().queryKey, null);
    },
  });
}

export function useChangePassword() {
  return useMutation({
    mutationFn: (values: ChangePassword) => http.post<SessionAnswer>("/api/me/password", values),
    // the change ends the other sessions and gives this one a new id, and with it a new token
    onSuccess: (answer) => setCsrfToken(answer.csrfToken),
  });
}

export function useUpdateLengthUnit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (lengthUnit: LengthUnit) => http.patch<{ user: CurrentUser }>("/api/me", { lengthUnit }),
    onSuccess: ({ user }) => {
      queryClient.setQueryData(authQueries.me().queryKey, (previous) => (previous ? { ...previous, user } : previous));
    },
  });
}
