// The policy version that scored an attempt. Roles that may read the settings read every version; other roles
// cannot, so for them only version 1 is known (the project defaults it always starts as).
import { useQuery } from "@tanstack/react-query";
import { DEFAULT_POLICY, type NetworkPolicy } from "../../../shared/scoring/policy";
import { useCan } from "../auth/useCan";
import { settingsQueries } from "../settings/queries";

export interface ScoringPolicy {
  policy: NetworkPolicy | null;
  /** "version" when read from the stored version, "defaults" when taken as the project defaults. */
  known: "version" | "defaults" | null;
  pending: boolean;
}

export function useScoringPolicy(version: number | undefined): ScoringPolicy {
  const readsVersions = useCan("readSettings");
  const versions = useQuery({ ...settingsQueries.versions(), enabled: readsVersions && version !== undefined });
  if (version === undefined) return { policy: null, known: null, pending: true };
  if (readsVersions) {
    if (versions.isPending) return { policy: null, known: null, pending: true };
    const found = versions.data?.find((v) => v.version === version);
    if (found) return { policy: found.policy, known: "version", pending: false };
  }
  if (version === 1) return { policy: DEFAULT_POLICY, known: "defaults", pending: false };
  return { policy: null, known: null, pending: false };
}
