import { fail, ok, type Result } from '../../engine/result.js';
import type { CommandOf, ParseContext } from './command.js';
import { parseMeasurement } from './measurement.js';
import { resolvePastTime, splitStatedTime } from './statedTime.js';

const READING_FILLER = /^(?:[:=]|at|is|reads?|level(?:\s+is)?|now(?:\s+at)?)\s*(?=[\d.+-])/i;

/**
 * A reading after its tank name: "60in", "5' 2\"", "48%", "410 gal", "ullage 14in", each with an optional
 * time ("at 7:30", "yesterday 4pm", "at 2026-11-02 07:30").
 */
export function parseReading(
  tank: string,
  rest: string,
  raw: string,
  context: ParseContext,
): Result<CommandOf<'reading'>> {
  // "T4 at 60in", "T4: 60in", "T4 is 60in", "T4 reads 60in": the little word carries nothing.
  const { body, timeText } = splitStatedTime(rest.replace(READING_FILLER, ''));
  const measurement = parseMeasurement(body);
  if (!measurement.ok) return fail(`${tank}: ${measurement.error}`);
  if (timeText === undefined) return ok({ type: 'reading', tank, measurement: measurement.value, raw });
  const time = resolvePastTime(timeText, context);
  if (!time.ok) return time;
  return ok({ type: 'reading', tank, measurement: measurement.value, time: time.value, raw });
}
