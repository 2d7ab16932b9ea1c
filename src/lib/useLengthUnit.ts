// Lengths (compression depth, recoil) are stored in millimetres and shown in the unit the signed-in user
// chose on the account page.
import { useQuery } from "@tanstack/react-query";
import { useCallback } from "react";
import { formatLength as formatLengthIn, fromMm, type LengthUnit } from "../../shared/units";
import { authQueries } from "../features/auth/queries";

export const lengthUnitNames: Record<LengthUnit, string> = { mm: "millimetres", cm: "centimetres", in: "inches" };

export function useLengthUnit() {
  const { data } = useQuery(authQueries.me());
  const unit: LengthUnit = data?.user.lengthUnit ?? "mm";
  const formatLength = useCallback((mm: number) => formatLengthIn(mm, unit), [unit]);
  const convert = useCallback((mm: number) => fromMm(mm, unit), [unit]);
  return { unit, formatLength, fromMm: convert };
}
