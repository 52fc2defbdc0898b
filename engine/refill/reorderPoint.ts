// Reorder point and safety stock, after Silver, Pyke & Thomas, "Inventory and Production Management in
// Supply Chains" (4th ed., CRC Press 2017), the continuous-review (s, Q) system with a cycle service level P1:
//   s = x̂_L + k σ_L,  σ_L = σ_1 √L  (demand independent from day to day),  k = Φ⁻¹(P1).
// Here "demand" is the tank's use. Two things make the use over a span uncertain, and both are counted:
// - day-to-day variation, σ_1 per day, which adds up as √L (the book's σ_L);
// - the error of the estimated rate itself, which persists and so grows as L (the book notes, from memory,
//   that measured σ_L often grows as L^c with c between 0.5 and 1; this is the c = 1 part).
// The forecast starts at the last reading, not at the order, so the uncertain span is the reading's age plus
// the lead time: the safety stock grows with the age of the last reading.
import { serviceFactor } from './serviceFactor.js';

export interface ReorderPointInput {
  /** Expected use per day (x̂_1), litres. */
  demandPerDay: number;
  /** Standard deviation of one day's use (σ_1), litres. */
  sigmaPerDay: number;
  /** Standard error of the estimated rate, litres/day: an error that persists over the whole span. */
  rateSigma?: number;
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
  const safetyStock = serviceFactor(input.serviceLevel) * useSpread(input, span);
  return { leadTimeDemand, safetyStock, reorderPoint: leadTimeDemand + safetyStock };
}

export interface UseUncertainty {
  sigmaPerDay: number;
  rateSigma?: number;
}

/** Standard deviation of the use over `days` days: sqrt(σ_1² d + σ_rate² d²), the two sources independent. */
export function useSpread(u: UseUncertainty, days: number): number {
  const d = Math.max(0, days);
  const rateSigma = u.rateSigma ?? 0;
  return Math.sqrt(u.sigmaPerDay * u.sigmaPerDay * d + rateSigma * rateSigma * d * d);
}

/**
 * Days after the last reading until the stock, at the service level, has used up `headroom` litres (the
 * volume above the threshold): the smallest t with  rate·t + k·useSpread(t) >= headroom.
 * The left side rises with t, so bisection finds it; null when the tank is not being used up (rate <= 0)
 * or the answer lies beyond `horizonDays`.
 */
export function daysToThreshold(
  headroom: number,
  ratePerDay: number,
  uncertainty: UseUncertainty,
  serviceLevel: number,
  horizonDays = 3650,
): number | null {
  if (headroom <= 0) return 0;
  if (!(ratePerDay > 0)) return null;
  const k = serviceFactor(serviceLevel);
  const used = (t: number) => ratePerDay * t + k * useSpread(uncertainty, t);
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
