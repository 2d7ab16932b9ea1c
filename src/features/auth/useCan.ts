// The client's reading of the permission table (shared/permissions.ts), the same table the server's guards
// read: pages show what the signed-in user may do and hide what the server would refuse.
import { can, type Permission, type Reach } from "../../../shared/permissions";
import { useSession } from "./useSession";

/** Whether the signed-in user holds the permission (with `needs: "any"`, over every row); false when signed out. */
export function useCan(permission: Permission, needs: Reach = "own"): boolean {
  const { data } = useSession();
  return data ? can(data.user, permission, needs) : false;
}
