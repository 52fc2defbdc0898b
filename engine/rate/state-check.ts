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
  if (!NUMBERS.every((k) => typeof s[k] === 'number' && Number.isFinite(s[k]))) return false;
  if (!ARRAYS.every((k) => Array.isArray(s[k]))) return false;
  if (!isProfile(s.dailyProfile) || !isProfile(s.useProfile)) return false;
  if (!(s.previousDip === null || isTimedVolume(s.previousDip))) return false;
  if (!(s.undo === null || isUndo(s.undo))) return false;
  if (!(s.rateUndo === null || isRateUndo(s.rateUndo))) return false;
  return (s.recentTimes as unknown[]).length === (s.recentVolumes as unknown[]).length;
}

const isProfile = (p: unknown) => Array.isArray(p) && p.length === 24 && p.every((x) => Number.isFinite(x));

const UNDO_NUMBERS = ['lastTime', 'v', 'r', 'p00', 'p01', 'p11', 'innovationVar', 'basisStart', 'basisCount'];

function isTimedVolume(value: unknown): boolean {
  if (typeof value !== 'object' || value === null) return false;
  const v = value as Record<string, unknown>;
  return Number.isFinite(v.time) && Number.isFinite(v.volume);
}

/** The filter kept after a rise (undo.ts): its numbers finite, its event count a count. */
const RISE_UNDO_NUMBERS = ['lastTime', 'v', 'r', 'p00', 'p01', 'p11', 'innovationVar', 'time', 'volume'];

function isUndo(value: unknown): boolean {
  if (typeof value !== 'object' || value === null) return false;
  const u = value as Record<string, unknown>;
  if (!RISE_UNDO_NUMBERS.every((k) => typeof u[k] === 'number' && Number.isFinite(u[k]))) return false;
  if (!(typeof u.eventCount === 'number' && Number.isInteger(u.eventCount) && u.eventCount >= 0))
    return false;
  return u.previousEvent === null || typeof u.previousEvent === 'object';
}

function isRateUndo(value: unknown): boolean {
  if (typeof value !== 'object' || value === null) return false;
  const u = value as Record<string, unknown>;
  if (!UNDO_NUMBERS.every((k) => typeof u[k] === 'number' && Number.isFinite(u[k]))) return false;
  if (!(typeof u.changeCount === 'number' && Number.isInteger(u.changeCount) && u.changeCount >= 0))
    return false;
  return Array.isArray(u.readings) && u.readings.length > 0;
}
