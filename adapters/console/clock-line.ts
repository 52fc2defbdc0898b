import { DateTime } from 'luxon';
import { fail, ok, type Result } from '../../engine/result.js';

/**
 * `/now 2026-11-09T08:00Z` (or with an offset, or a zone name after it) sets the console's clock: scripts and
 * tests replay a fortnight in a second. Returns undefined for any other line, which goes to the bot.
 */
export function parseClockLine(line: string): Result<number> | undefined {
  const match = /^\/now\s+(\S+)(?:\s+(\S+))?\s*$/.exec(line.trim());
  if (!match) return line.trim().startsWith('/now') ? fail(clockHelp) : undefined;
  const zone = match[2] ?? 'UTC';
  const dt = DateTime.fromISO(match[1]!, { zone, setZone: true });
  if (!dt.isValid) return fail(clockHelp);
  return ok(dt.toMillis());
}

const clockHelp =
  'To set the console clock write `/now 2026-11-09T08:00Z` (ISO 8601, with Z, an offset, or a zone name after it).';
