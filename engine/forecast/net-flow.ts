// Static net-flow arithmetic: with a steady inflow and outflow, how long until the tank reaches a volume.
import { fail, ok, type Result } from '../result.js';

export interface NetFlowInput {
  /** Litres in the tank now. */
  volume: number;
  /** Litres per day flowing in and out (each zero or more). */
  inflow: number;
  outflow: number;
  /** Litres: the level of concern when emptying (default 0 = empty). */
  target?: number;
  /** Litres: the tank's capacity, to say when a filling tank is full. */
  capacity?: number;
}

export type NetFlowState = 'emptying' | 'filling' | 'steady' | 'at-target';

export interface NetFlowEta {
  state: NetFlowState;
  /** Litres per day, outflow - inflow: positive while emptying. */
  netOutflow: number;
  /** Litres the runway runs down to. */
  target: number;
  /** Days until the target is reached while emptying; 0 at or below it; null while filling or steady. */
  days: number | null;
  /** Days until full, while filling with a known capacity; otherwise null. */
  daysToFull: number | null;
  /** One sentence for a person. */
  message: string;
}

const finiteNonNegative = (x: number | undefined) => x === undefined || (Number.isFinite(x) && x >= 0);

/** Net outflow = outflow - inflow; days to the target = (volume - target) / net outflow. */
export function netFlowEta(input: NetFlowInput): Result<NetFlowEta> {
  const { volume, inflow, outflow, capacity } = input;
  const target = input.target ?? 0;
  if (!finiteNonNegative(volume)) return fail('the volume must be a number of zero or more');
  if (!finiteNonNegative(inflow) || !finiteNonNegative(outflow))
    return fail('flows must be numbers of zero or more');
  if (!finiteNonNegative(target)) return fail('the target must be a volume of zero or more');
  if (capacity !== undefined) {
    if (!(Number.isFinite(capacity) && capacity > 0)) return fail('the capacity must be above zero');
    if (volume > capacity) return fail('the volume is above the capacity: check both');
    if (target > capacity) return fail('the target is above the capacity: check both');
  }
  const netOutflow = outflow - inflow;
  const base = { netOutflow, target, daysToFull: null };
  if (netOutflow > 0) {
    if (volume <= target)
      return ok({
        ...base,
        state: 'at-target',
        days: 0,
        message: 'The tank is already at or below the target.',
      });
    const days = (volume - target) / netOutflow;
    if (!Number.isFinite(days))
      return ok({
        ...base,
        state: 'steady',
        days: null,
        message: 'The net outflow is too small to ever reach the target.',
      });
    return ok({
      ...base,
      state: 'emptying',
      days,
      message: `At this net outflow the target is reached in ${days.toPrecision(3)} days.`,
    });
  }
  if (netOutflow < 0) {
    const daysToFull = capacity === undefined ? null : (capacity - volume) / -netOutflow;
    const full = daysToFull === null ? '' : ` It is full in ${daysToFull.toPrecision(3)} days at this rate.`;
    return ok({
      ...base,
      state: 'filling',
      days: null,
      daysToFull,
      message: `Inflow exceeds outflow, so the tank is filling and never runs down.${full}`,
    });
  }
  return ok({
    ...base,
    state: 'steady',
    days: null,
    message: 'Inflow equals outflow: the volume holds steady.',
  });
}
