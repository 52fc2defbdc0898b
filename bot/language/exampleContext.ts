import type { Command, ParseContext } from './command.js';
import { parseMessage } from './parse.js';

/**
 * The context the language's tests and examples run in: the demo team (demo data, invented) on
 * Tuesday 2026-11-10 09:00 in America/Chicago (15:00 UTC).
 */
export const exampleContext: ParseContext = {
  now: Date.parse('2026-11-10T15:00:00Z'),
  timeZone: 'America/Chicago',
  tankNames: ['T4', 'T9', 'GEN-1', 'North Yard 2'],
};

/** The command a message parses to; throws with the parser's own message when it does not parse. */
export function commandOf(text: string, context: ParseContext = exampleContext): Command {
  const result = parseMessage(text, context);
  if (!result.ok) throw new Error(`"${text}" did not parse: ${result.error}`);
  return result.value;
}

/** The error a message gets; throws when it parses. */
export function errorOf(text: string, context: ParseContext = exampleContext): string {
  const result = parseMessage(text, context);
  if (result.ok) throw new Error(`"${text}" parsed as ${JSON.stringify(result.value)}`);
  return result.error;
}

/** An error that says what to fix: it gives an example, names a fix, or suggests a name. */
export const SAYS_WHAT_TO_FIX =
  /`[^`]+`|\b(?:write|give|use|try|send|add|say|check|choose|leave out|name|set|did you mean|rephrase)\b/i;
