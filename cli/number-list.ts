// Comma-separated numbers on the command line ("0.1,0.5,1.2"), each optionally with its own unit ("62in").
import { parseQuantity, type QuantityKind } from '../engine/units/index.js';
import { UsageError } from './io.js';

export interface ListedValue {
  value: number;
  /** The unit written beside the number (canonical id), or null for a bare number. */
  unit: string | null;
  kind: QuantityKind | null;
}

/** A plain decimal number, no unit and no thousands commas. */
export const isBareNumber = (text: string): boolean =>
  /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text.trim());

/** One value: a bare number, or a number with its unit ("62in", "1 gpm"); throws UsageError naming the option. */
export function parseListedValue(raw: string, option: string): ListedValue {
  const entry = raw.trim();
  if (isBareNumber(entry)) return { value: Number(entry), unit: null, kind: null };
  const quantity = parseQuantity(entry);
  if (!quantity.ok)
    throw new UsageError(`--${option}: ${entry === '' ? 'an empty entry' : `"${entry}"`}: ${quantity.error}`);
  return { value: quantity.value.value, unit: quantity.value.unit, kind: quantity.value.kind };
}

/** Splits and reads the list; throws UsageError naming the option and the entry that is not a number. */
export function parseNumberList(text: string | undefined, option: string): ListedValue[] {
  if (text === undefined || text.trim() === '')
    throw new UsageError(`--${option} is required: give numbers separated by commas`);
  return text.split(',').map((raw) => parseListedValue(raw, option));
}
