import { useQuery } from "@tanstack/react-query";
import { authQueries } from "./queries";

/** The signed-in session: data is the session answer, or null when signed out. */
export function useSession() {
  return useQuery(authQueries.me());
}

/** The signed-in user; only for components rendered behind the session guard. */
export function useCurrentUser() {
  const { data } = useSession();
  if (!data) throw new Error("useCurrentUser needs a signed-in session (render it behind RequireSession)");
  return data.user;
}
