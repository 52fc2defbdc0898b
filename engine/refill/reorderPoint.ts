// Reorder point and safety stock, after Silver, Pyke & Thomas, "Inventory and Production Management in
// Supply Chains" (4th ed., CRC Press 2017), the continuous-review (s, Q) system with a cycle service level P1:
//   s = x̂_L + k σ_L,  σ_L = σ_1 √L  (demand independent from day to day),  k = Φ⁻¹(P1).
// Here "demand" is the tank's use: the rate (L/day) gives x̂, and the rate's uncertainty gives σ_1. The
// forecast starts at the last reading, not at the order, so the uncertain span is the reading's age plus the
// lead time: σ grows with the age of the last reading, as σ_1 √(age + L).
import { serviceFactor } from './serviceFactor.js';

export interface ReorderPointInput {
  /** Expected use per day (x̂_1), litres. */
  demandPerDay: number;
  /** Standard deviation of one day's use (σ_1), litres. */
  sigmaPerDay: number;
  /** Lead time L, days. */
  leadTimeDays: number;
  /** Target cycle service level P1, e.g. 0.95. */
  serviceLevel: number;
  /** Days since the last reading when the order is placed: use in that span is unseen, so uncertain too. */
  readingAgeDays?: number;
}

export interface ReorderPoint {
  /** x̂_L: expected use over the lead time. */
  leadTimeDemand: number;
  /** k σ_L: the buffer for use above the expected. */
  safetyStock: number;
  /** s = x̂_L + k σ_L: order when the stock above the threshold falls to this. */
  reorderPoint: number;
}

export function reorderPoint(input: ReorderPointInput): ReorderPoint {
  const leadTimeDemand = input.demandPerDay * input.leadTimeDays;
  const span = input.leadTimeDays + (input.readingAgeDays ?? 0);
  const safetyStock = serviceFactor(input.serviceLevel) * useSpread(input.sigmaPerDay, span);
  return { leadTimeDemand, safetyStock, reorderPoint: leadTimeDemand + safetyStock };
}

/** Standard deviation of the use over `days` days when one day's use has standard deviation `sigmaPerDay`. */
export function useSpread(sigmaPerDay: number, days: number): number {
  return sigmaPerDay * Math.sqrt(Math.max(0, days));
}

/**
 * Days after the last reading until the stock, at the service level, has used up `headroom` litres (the
 * volume above the threshold): the smallest t with  rate·t + k·useSpread(σ, t) >= headroom.
 * The left side rises with t, so bisection finds it; null when the tank is not being used up (rate <= 0)
 * or the answer lies beyond `horizonDays`.
 */
export function daysToThreshold(
  headroom: number,
  ratePerDay: number,
  sigmaPerDay: number,
  serviceLevel: number,
  horizonDays = 3650,
): number | null {
  if (headroom <= 0) return 0;
  if (!(ratePerDay > 0)) return null;
  const k = serviceFactor(serviceLevel);
  const used = (t: number) => ratePerDay * t + k * useSpread(sigmaPerDay, t);
  let hi = headroom / ratePerDay; // the expected use alone reaches the headroom here; k >= 0 only adds
  if (hi > horizonDays) {
    if (used(horizonDays) < headroom) return null;
    hi = horizonDays;
  }
  let lo = 0;
  for (let i = 0; i < 60 && hi - lo > 1e-9; i++) {
    const mid = (lo + hi) / 2;
    if (used(mid) >= headroom) hi = mid;
    else lo = mid;
  }
  return hi;
}
