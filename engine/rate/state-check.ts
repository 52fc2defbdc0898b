// Checks a stored estimator state before it is resumed: a cache written by another version, or damaged,
// must be rebuilt from the readings rather than resumed into wrong answers or a crash.
import { RATE_STATE_VERSION } from './state.js';
import type { RateEstimatorState } from './types.js';

const NUMBERS = [
  'count',
  'v',
  'r',
  'p00',
  'p01',
  'p11',
  'innovationVar',
  'dtMean',
  'scale',
  'cusumPos',
  'cusumNeg',
  'cusumPosStart',
  'cusumNegStart',
  'basisStart',
  'basisCount',
  'dailyProfileSum',
  'loggedSinceDip',
  'useProfileSum',
] as const;
const ARRAYS = [
  'recentTimes',
  'recentVolumes',
  'pending',
  'loggedPending',
  'dipIntervals',
  'events',
  'changes',
  'suspects',
] as const;

export function isRateEstimatorState(value: unknown): value is RateEstimatorState {
  if (typeof value !== 'object' || value === null) return false;
  const s = value as Record<string, unknown>;
  if (s.version !== RATE_STATE_VERSION || typeof s.filling !== 'boolean') return false;
  if (!(s.capacity === null || (typeof s.capacity === 'number' && s.capacity > 0))) return false;
  if (!(s.lastTime === null || Number.isFinite(s.lastTime))) return false;
  if (!allFinite(s, NUMBERS)) return false;
  if (!ARRAYS.every((k) => Array.isArray(s[k]))) return false;
  if (!isProfile(s.dailyProfile) || !isProfile(s.useProfile)) return false;
  if (!(s.previousDip === null || isTimedVolume(s.previousDip))) return false;
  if (!(s.undo === null || isUndo(s.undo))) return false;
  if (!(s.rateUndo === null || isRateUndo(s.rateUndo))) return false;
  return (s.recentTimes as unknown[]).length === (s.recentVolumes as unknown[]).length;
}

const allFinite = (u: Record<string, unknown>, keys: readonly string[]) =>
  keys.every((k) => typeof u[k] === 'number' && Number.isFinite(u[k]));

const isProfile = (p: unknown) => Array.isArray(p) && p.length === 24 && p.every((x) => Number.isFinite(x));

const UNDO_NUMBERS = ['lastTime', 'v', 'r', 'p00', 'p01', 'p11', 'innovationVar', 'basisStart', 'basisCount'];

function isTimedVolume(value: unknown): boolean {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as Record<string, unknown>;
  return Number.isFinite(v.time) && Number.isFinite(v.volume);
}

/** The filter kept after a rise (undo.ts): its numbers finite, its event count a count. */
const RISE_UNDO_NUMBERS = ['lastTime', 'v', 'r', 'p00', 'p01', 'p11', 'innovationVar', 'time', 'volume'];

/** An object whose `numbers` are finite and whose `count` is a count, or null. */
function withNumbersAndCount(
  value: unknown,
  numbers: readonly string[],
  count: string,
): Record<string, unknown> | null {
  if (typeof value !== 'object' || value === null) return null;
  const u = value as Record<string, unknown>;
  if (!allFinite(u, numbers)) return null;
  const n = u[count];
  return typeof n === 'number' && Number.isInteger(n) && n >= 0 ? u : null;
}

function isUndo(value: unknown): boolean {
  const u = withNumbersAndCount(value, RISE_UNDO_NUMBERS, 'eventCount');
  return u !== null && (u.previousEvent === null || typeof u.previousEvent === 'object');
}

function isRateUndo(value: unknown): boolean {
  const u = withNumbersAndCount(value, UNDO_NUMBERS, 'changeCount');
  return u !== null && Array.isArray(u.readings) && u.readings.length > 0;
}
