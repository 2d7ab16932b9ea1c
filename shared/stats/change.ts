// Change of a figure between two periods. Missing or non-finite inputs give nulls, never NaN.

export interface Change {
  /** current − previous; null when either is missing. */
  absolute: number | null;
  /**
   * (current − previous) / |previous| as a fraction (0.25 = +25 %); null when either is
   * missing or previous is 0. Dividing by |previous| keeps the sign meaning "went up".
   */
  relative: number | null;
}

export function changeFrom(current: number | null | undefined, previous: number | null | undefined): Change {
  if (!isPresent(current) || !isPresent(previous)) return { absolute: null, relative: null };
  const absolute = current - previous;
  const relative = previous === 0 ? null : absolute / Math.abs(previous);
  return { absolute, relative };
}

function isPresent(value: number | null | undefined): value is number {
  return typeof value === "number" && Number.isFinite(value);
}
