// Length units. Everything is stored and computed in millimetres; other units exist only at the edges
// (display and user input).
import { lengthUnits } from "./domain";

export type LengthUnit = (typeof lengthUnits)[number]; // "mm" | "cm" | "in"

/** Exact by definition (international yard and pound agreement, 1959). */
export const MM_PER_INCH = 25.4;
export const MM_PER_CM = 10;

const mmPerUnit: Record<LengthUnit, number> = { mm: 1, cm: MM_PER_CM, in: MM_PER_INCH };

/** Decimals shown per unit: a millimetre or a tenth of a centimetre is finer than a depth sensor's noise. */
const displayDecimals: Record<LengthUnit, number> = { mm: 1, cm: 1, in: 2 };

export function fromMm(mm: number, unit: LengthUnit): number {
  return unit === "mm" ? mm : mm / mmPerUnit[unit];
}

export function toMm(value: number, unit: LengthUnit): number {
  return unit === "mm" ? value : value * mmPerUnit[unit];
}

/**
 * "50 mm", "38.1 mm", "5.0 cm", "2.00 in". Millimetres drop a trailing ".0"; centimetres and inches keep a
 * fixed number of decimals so columns line up. A missing or non-finite value shows as "–".
 */
export function formatLength(mm: number, unit: LengthUnit): string {
  if (!Number.isFinite(mm)) return "–";
  let text = fromMm(mm, unit).toFixed(displayDecimals[unit]);
  if (unit === "mm") text = text.replace(/\.0$/, "");
  if (/^-0(\.0+)?$/.test(text)) text = text.slice(1); // a value that rounds to zero is not negative
  return `${text} ${unit}`;
}
