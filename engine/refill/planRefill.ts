// The refill plan for one tank at `now`: when to order (or book a pick-up), what arrives when, and how much.
// Pure: the clock is an argument. Litres, epoch ms, litres per day (positive while emptying).
import { fail, ok, type Result } from '../result.js';
import { arrivalDay, deliveryCloses, deliveryOpens, latestOrderFor } from './deliveryCalendar.js';
import { orderQuantity, type QuantityIssue } from './orderQuantity.js';
import { daysToThreshold, reorderPoint } from './reorderPoint.js';
import { parseRefillSettings, type RefillSettings, type RefillSettingsInput } from './settings.js';

const DAY_MS = 86_400_000;
/** An order-by further out than this is "no order needed" (../shared/docs/cli-contract.md section 5). */
export const ORDER_BY_WINDOW_DAYS = 14;
/**
 * Day-to-day variation of the use, as a fraction of the rate (σ_1 = USE_CV x rate). The rate's standard
 * error says how well a steady rate is known, not how much one day differs from the next (shifts, weekends,
 * weather, a process change); without a measured figure this is a design choice, checked against the
 * closed-loop simulation in `npm run bench:accuracy`, not a fact of the trade.
 */
export const USE_CV = 0.2;
/** A filtered volume may overshoot the capacity a little; beyond this it is a wrong reading or tank. */
const OVER_CAPACITY_TOLERANCE = 0.02;

export interface RefillInput {
  now: number;
  /** Filtered volume at `lastReadingAt`, litres. */
  volume: number;
  lastReadingAt: number;
  /** Litres per day, positive while emptying, and its standard error (engine/rate RatePoint). */
  rate: number;
  rateSigma: number;
  /** Litres; without it percent thresholds and the fill quantity cannot be worked out. */
  capacity?: number;
  /** A waste tank: plan a pick-up instead. Said by the caller: a noisy, slightly negative rate on a supply
   * tank must not turn its plan into a pick-up. */
  filling?: boolean;
  /** Threshold, minimum and increment in litres. */
  settings: RefillSettingsInput;
}

/** The forecast a plan starts from, taken from a rate point (engine/rate `RatePoint` has these fields). */
export function forecastOf(point: {
  time: number;
  volume: number;
  rate: number;
  rateSigma: number;
}): Pick<RefillInput, 'volume' | 'lastReadingAt' | 'rate' | 'rateSigma'> {
  return { volume: point.volume, lastReadingAt: point.time, rate: point.rate, rateSigma: point.rateSigma };
}

export interface RefillPlan {
  verdict: 'order-now' | 'order-by' | 'no-order-needed';
  /** A delivery into an emptying tank, or a pick-up from a filling one. */
  mode: 'delivery' | 'pick-up';
  /** Latest order time that still arrives in time; null when the threshold is never reached at this rate. */
  orderBy: number | null;
  /** Close of the delivery hours (end of the day by default) of the latest delivery day before the threshold. */
  deliveryBy: number | null;
  /** When the tank reaches its threshold at the service level (the early side of the forecast). */
  thresholdAt: number | null;
  /** Close of the delivery hours on the delivery day of an order placed now. */
  earliestDelivery: number;
  /** Litres to order (to the safe fill level on arrival, whole increments, at least the minimum); null
   * when the capacity is unknown. A pick-up: litres to take. */
  quantity: number | null;
  quantityIssue: QuantityIssue | null;
  /** Litres expected in the tank when the planned delivery can first arrive (the opening of its delivery
   * hours, or now). */
  expectedVolumeOnArrival: number;
  /** Tank volume at which to order, and the safety stock inside it, litres. */
  reorderPoint: number;
  safetyStock: number;
  thresholdVolume: number;
  safeFillVolume: number | null;
  /** What it takes to size this tank's share of a delivery at another time (site consolidation). */
  sizing: PlanSizing;
}

export interface PlanSizing {
  /** The moment `expectedVolumeOnArrival` refers to. */
  arrivalAt: number;
  /** Litres per day, positive while emptying. */
  ratePerDay: number;
  minimumOrder: number;
  orderIncrement: number;
}

export function planRefill(input: RefillInput): Result<RefillPlan> {
  const settings = parseRefillSettings(input.settings);
  return settings.ok ? planRefillWith(input, settings.value) : settings;
}

/**
 * `planRefill` with settings already validated (`parseRefillSettings`): a caller planning many tanks that
 * share their settings validates each distinct one once.
 */
export function planRefillWith(
  input: Omit<RefillInput, 'settings'>,
  settings: RefillSettings,
): Result<RefillPlan> {
  const checked = checkInput(input);
  if (!checked.ok) return checked;
  const { capacity, volume } = checked.value;
  const filling = input.filling ?? false;
  const flow = filling ? -input.rate : input.rate; // litres per day toward the threshold
  const safeFillVolume = capacity === undefined ? null : (capacity * settings.safeFillPercent) / 100;

  const threshold = thresholdVolume(settings, capacity, safeFillVolume, flow, filling);
  if (!threshold.ok) return threshold;
  const thresholdLitres = threshold.value;
  const headroom = filling ? thresholdLitres - volume : volume - thresholdLitres;
  const uncertainty = { sigmaPerDay: USE_CV * Math.max(0, flow), rateSigma: input.rateSigma };
  const days = daysToThreshold(headroom, flow, uncertainty, settings.serviceLevel);
  const thresholdAt = days === null ? null : input.lastReadingAt + days * DAY_MS;

  const latest = thresholdAt === null ? null : latestOrderFor(thresholdAt, settings);
  if (thresholdAt !== null && latest === null) {
    return fail('No delivery day fits the refill settings; check deliveryWeekdays and leadTimeDays.');
  }
  const orderBy = latest?.orderBy ?? null;
  const verdict =
    orderBy === null || orderBy > input.now + ORDER_BY_WINDOW_DAYS * DAY_MS
      ? 'no-order-needed'
      : orderBy <= input.now
        ? 'order-now'
        : 'order-by';

  // The order this plan stands for: placed now when late (or when there is no deadline), else at orderBy.
  const orderAt = verdict === 'order-now' || orderBy === null ? input.now : orderBy;
  const deliveryDay = orderAt === orderBy && latest ? latest.deliveryDay : arrivalDay(orderAt, settings);
  const deliveryEnd = deliveryCloses(deliveryDay, settings);
  const arrival = Math.max(deliveryOpens(deliveryDay, settings), input.now, input.lastReadingAt);
  // The opening of the delivery hours is when an emptying tank holds the most (and a filling one the least):
  // sizing the order there keeps the earliest possible delivery below the safe fill level.
  const expected = clamp(volume - (input.rate * (arrival - input.lastReadingAt)) / DAY_MS, 0, capacity);
  // Sized on the expected volume, as the order states it (safe fill minus expected, whole increments): the
  // figure a person can check. A tank that used less than expected has less room, so every reply with a
  // quantity tells the crew to gauge before filling (common practice) rather than trust the forecast.
  const sized = quantityFor(filling, expected, safeFillVolume, settings);

  const rp = reorderPoint({
    demandPerDay: Math.max(0, flow),
    ...uncertainty,
    leadTimeDays: (deliveryEnd - orderAt) / DAY_MS,
    serviceLevel: settings.serviceLevel,
    readingAgeDays: (orderAt - input.lastReadingAt) / DAY_MS,
  });
  return ok({
    verdict,
    mode: filling ? 'pick-up' : 'delivery',
    orderBy,
    deliveryBy: latest?.deliveryBy ?? null,
    thresholdAt,
    earliestDelivery:
      orderAt === input.now ? deliveryEnd : deliveryCloses(arrivalDay(input.now, settings), settings),
    quantity: sized.quantity,
    quantityIssue: sized.issue,
    expectedVolumeOnArrival: expected,
    reorderPoint: filling ? thresholdLitres - rp.reorderPoint : thresholdLitres + rp.reorderPoint,
    safetyStock: rp.safetyStock,
    thresholdVolume: thresholdLitres,
    safeFillVolume,
    sizing: {
      arrivalAt: arrival,
      ratePerDay: input.rate,
      minimumOrder: settings.minimumOrder,
      orderIncrement: settings.orderIncrement,
    },
  });
}

const finite = (x: unknown) => typeof x === 'number' && Number.isFinite(x);

function checkInput(
  input: Omit<RefillInput, 'settings'>,
): Result<{ capacity: number | undefined; volume: number }> {
  for (const key of ['now', 'volume', 'lastReadingAt', 'rate', 'rateSigma'] as const) {
    if (!finite(input[key]))
      return fail(`Cannot plan a refill: ${key} is not a number (${String(input[key])}).`);
  }
  if (input.rateSigma < 0) return fail('Cannot plan a refill: the rate uncertainty is negative.');
  if (input.now < input.lastReadingAt) {
    return fail('Cannot plan a refill for a time before the last reading; plan at or after it.');
  }
  const capacity = input.capacity;
  if (capacity !== undefined && !(finite(capacity) && capacity > 0)) {
    return fail(`Cannot plan a refill: the tank capacity ${String(capacity)} is not a positive volume.`);
  }
  if (capacity !== undefined && input.volume > capacity * (1 + OVER_CAPACITY_TOLERANCE)) {
    return fail(
      `The volume ${round(input.volume)} L is above the tank's capacity of ${round(capacity)} L; check the reading or the tank's shape.`,
    );
  }
  // A filtered volume a hair below zero or above capacity is noise, not news.
  return ok({ capacity, volume: clamp(input.volume, 0, capacity) });
}

function thresholdVolume(
  settings: RefillSettings,
  capacity: number | undefined,
  safeFill: number | null,
  flow: number,
  filling: boolean,
): Result<number> {
  const t = settings.threshold;
  if ('percent' in t) {
    if (capacity === undefined)
      return fail('A percent threshold needs the tank capacity (give the tank or its capacity).');
    return ok((capacity * t.percent) / 100);
  }
  if ('volume' in t) {
    if (capacity !== undefined && t.volume > capacity) {
      return fail(`The threshold ${round(t.volume)} L is above the tank's capacity of ${round(capacity)} L.`);
    }
    return ok(t.volume);
  }
  // A minimum runway: keep `runwayDays` of use in hand (a filling tank: that much room below the safe fill).
  const use = Math.max(0, flow) * t.runwayDays;
  if (!filling) return ok(use);
  if (safeFill === null) return fail('A runway threshold on a filling tank needs the tank capacity.');
  return ok(Math.max(0, safeFill - use));
}

function quantityFor(filling: boolean, volume: number, safeFill: number | null, settings: RefillSettings) {
  if (filling) return orderQuantity(volume, settings.minimumOrder, settings.orderIncrement);
  if (safeFill === null) return { quantity: null, issue: 'capacity-unknown' as const };
  return orderQuantity(safeFill - volume, settings.minimumOrder, settings.orderIncrement);
}

function clamp(x: number, low: number, high: number | undefined): number {
  return Math.min(Math.max(x, low), high ?? Number.POSITIVE_INFINITY);
}

const round = (x: number) => Math.round(x * 10) / 10;

/**
 * The plan with every volume passed through `convert` (litres to a display unit, or back); dates, the verdict
 * and `sizing` (kept in litres for site consolidation) are left as they are. A new plan of these fields only,
 * written out: a digest maps every tank's plan twice, and spreading the plan was a measurable part of it.
 */
export function mapPlanVolumes(plan: RefillPlan, convert: (volume: number) => number): RefillPlan {
  return {
    verdict: plan.verdict,
    mode: plan.mode,
    orderBy: plan.orderBy,
    deliveryBy: plan.deliveryBy,
    thresholdAt: plan.thresholdAt,
    earliestDelivery: plan.earliestDelivery,
    quantity: plan.quantity === null ? null : convert(plan.quantity),
    quantityIssue: plan.quantityIssue,
    expectedVolumeOnArrival: convert(plan.expectedVolumeOnArrival),
    reorderPoint: convert(plan.reorderPoint),
    safetyStock: convert(plan.safetyStock),
    thresholdVolume: convert(plan.thresholdVolume),
    safeFillVolume: plan.safeFillVolume === null ? null : convert(plan.safeFillVolume),
    sizing: plan.sizing,
  };
}
