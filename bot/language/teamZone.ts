import type { Result } from '../../engine/result.js';
import { BoundedMemo } from '../bounded-memo.js';
import { checkTimeZone } from '../schedule/local-time.js';

/** Checking a zone builds an Intl formatter, the slowest step of reading a message; a team's zone rarely changes. */
const checked = new BoundedMemo<string, Result<string>>(256);

/** The team's zone, checked once per process (bot/schedule's check, remembered). */
export function checkTeamZone(zone: string): Result<string> {
  return checked.get(zone, checkTimeZone);
}
