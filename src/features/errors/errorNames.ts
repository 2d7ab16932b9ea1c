// Short names for the errors where space is tight (chart axes); tables and text use the full labels.
import type { AttemptError } from "../../../shared/scoring/scoreAttempt";

export const shortErrorNames: Record<AttemptError, string> = {
  too_shallow: "Too shallow",
  too_deep: "Too deep",
  too_slow: "Too slow",
  too_fast: "Too fast",
  incomplete_recoil: "Incomplete recoil",
  low_hands_on: "Low hands-on time",
  long_pause: "Long pause",
};
