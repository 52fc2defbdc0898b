import type { Result } from '../../engine/result.js';
import { checkTimeZone } from '../schedule/local-time.js';

/** Checking a zone builds an Intl formatter, the slowest step of reading a message; a team's zone rarely changes. */
const checked = new Map<string, Result<string>>();
const MAX_REMEMBERED = 256;

/** The team's zone, checked once per process (bot/schedule's check, remembered). */
export function checkTeamZone(zone: string): Result<string> {
  const known = checked.get(zone);
  if (known) return known;
  const result = checkTimeZone(zone);
  if (checked.size >= MAX_REMEMBERED) checked.clear();
  checked.set(zone, result);
  return result;
}
