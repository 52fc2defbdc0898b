// How the accuracy report writes its figures: a missing or non-finite one is "n/a".

/** 0.123 -> "12.3%". */
export const pct = (x: number | null) =>
  x !== null && Number.isFinite(x) ? `${(100 * x).toFixed(1)}%` : 'n/a';

/** A plain figure with `digits` decimals (3 by default). */
export const num = (x: number, digits = 3) => (Number.isFinite(x) ? x.toFixed(digits) : 'n/a');
