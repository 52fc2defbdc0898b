import { closest, distance } from 'fastest-levenshtein';
import { fail, ok, type Result } from '../../engine/result.js';
import { CANCEL_WORDS, COMMAND_WORDS, NO_WORDS, OVERVIEW_WORDS, YES_WORDS } from './words.js';

/** How a name is written in a message: letters, digits and a few joiners, at most 64 characters. */
const TANK_NAME_PATTERN = /^[\p{L}\p{N}][\p{L}\p{N}_.\-/#]{0,63}$/u;

/** Words a tank may not be called, or messages like "all" or "undo" would name it instead of asking. */
export const isReservedWord = (word: string): boolean => {
  const w = word.toLowerCase();
  return (
    COMMAND_WORDS.includes(w) ||
    OVERVIEW_WORDS.has(w) ||
    YES_WORDS.has(w) ||
    NO_WORDS.has(w) ||
    CANCEL_WORDS.has(w)
  );
};

export const isTankNameShaped = (word: string): boolean => TANK_NAME_PATTERN.test(word);

/** The team's nearest tank name to a word, when one is close enough to be a likely typo. */
export function nearestTankName(word: string, tankNames: readonly string[]): string | undefined {
  if (tankNames.length === 0) return undefined;
  const lower = word.toLowerCase();
  const best = closest(
    lower,
    tankNames.map((n) => n.toLowerCase()),
  );
  const limit = Math.max(2, Math.floor(lower.length / 3));
  if (distance(lower, best) > limit) return undefined;
  return tankNames.find((n) => n.toLowerCase() === best);
}

/**
 * The words at the start of `text` that look like a typo of a known tank name with as many words
 * ("Nrth Yard 2 48%" -> "Nrth Yard 2"), for "did you mean".
 */
export function typedTankPrefix(text: string, tankNames: readonly string[]): string | undefined {
  const words = text.replace(/\?$/, '').split(/\s+/);
  let best: { typed: string; score: number } | undefined;
  for (const name of tankNames) {
    const count = name.split(/\s+/).length;
    if (count > words.length) continue;
    const typed = words.slice(0, count).join(' ').replace(/\?$/, '');
    if (nearestTankName(typed, [name]) === undefined) continue;
    const score = distance(typed.toLowerCase(), name.toLowerCase());
    if (!best || score < best.score) best = { typed, score };
  }
  return best?.typed;
}

/**
 * The longest known tank name (case-insensitive, words separated by spaces) that starts `text`, so names
 * with spaces ("North Yard 2") work; returns the team's spelling and the rest of the text.
 */
export function matchTankPrefix(
  text: string,
  tankNames: readonly string[],
): { tank: string; rest: string } | undefined {
  const lower = text.toLowerCase();
  let found: { tank: string; rest: string } | undefined;
  for (const name of tankNames) {
    const n = name.toLowerCase();
    if (!lower.startsWith(n)) continue;
    const next = text.charAt(n.length);
    if (next !== '' && !/[\s?+,:]/.test(next)) continue;
    if (!found || name.length > found.tank.length) found = { tank: name, rest: text.slice(n.length).trim() };
  }
  return found;
}

/** A known tank by exact (case-insensitive) name, or an error that suggests the nearest one. */
export function resolveTankName(word: string, tankNames: readonly string[]): Result<string> {
  const exact = tankNames.find((n) => n.toLowerCase() === word.toLowerCase());
  if (exact) return ok(exact);
  return fail(unknownTankMessage(word, tankNames));
}

export function unknownTankMessage(word: string, tankNames: readonly string[]): string {
  const shown = word.length > 40 ? `${word.slice(0, 40)}…` : word;
  if (tankNames.length === 0) {
    return `There is no tank named "${shown}" yet: add it first, e.g. \`add tank ${isTankNameShaped(word) ? word : 'T4'} vertical-cylinder diameter=48in length=72in unit=gal\`.`;
  }
  const near = nearestTankName(word, tankNames);
  if (near)
    return `There is no tank named "${shown}". Did you mean ${near}? Send the message again with ${near}.`;
  const lower = tankNames.map((n) => n.toLowerCase());
  const nearest = tankNames[lower.indexOf(closest(word.toLowerCase(), lower))] ?? tankNames[0];
  const listed = tankNames.slice(0, 8).join(', ') + (tankNames.length > 8 ? ', …' : '');
  return `There is no tank named "${shown}" (the nearest is ${nearest}). Use one of your tanks (${listed}), or add it with \`add tank ${isTankNameShaped(word) ? word : 'NAME'} ...\`.`;
}
