// ISO 8601 instants for the readings CSV and the analyze JSON, fast for long series: a year of 5-minute
// readings is 105k parses and 210k formats. Each fast path covers the common shape and hands anything else
// to the built-in Date (the reference: the fast-check tests compare both on random strings and instants).

// ISO 8601 date-time with a UTC offset or Z (seconds and fractions optional).
const ISO_INSTANT = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}(:?\d{2})?)$/i;

/** The reference parse: the pattern above, then Date.parse on the normalised text. */
export function parseInstantSlow(text: string): number | null {
  if (!ISO_INSTANT.test(text)) return null;
  const normal =
    text.length === 20 && text[10] === 'T' ? text : text.replace(' ', 'T').replace(/([+-]\d{2})$/, '$1:00');
  const ms = Date.parse(normal);
  return Number.isFinite(ms) ? ms : null;
}

/** Digits at [at, at + n) as a number, or -1 if any is not an ASCII digit. */
function digits(text: string, at: number, n: number): number {
  let value = 0;
  for (let i = at; i < at + n; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) return -1;
    value = value * 10 + d;
  }
  return value;
}

/**
 * Epoch ms of an ISO 8601 instant with Z or an offset, or null. Fast path: `YYYY-MM-DDTHH:MM:SS` with an
 * optional `.mmm`, then `Z` or `+HH:MM`/`-HH:MM`, year 1000 or later, day 1-28, hour 0-23; the rest (other
 * shapes, days 29-31, which the built-in parse rolls over) goes to `parseInstantSlow`.
 */
export function parseInstant(text: string): number | null {
  const n = text.length;
  if (n < 20 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45 || text.charCodeAt(10) !== 84) {
    return parseInstantSlow(text);
  }
  if (text.charCodeAt(13) !== 58 || text.charCodeAt(16) !== 58) return parseInstantSlow(text);
  const year = digits(text, 0, 4);
  const month = digits(text, 5, 2);
  const day = digits(text, 8, 2);
  const hour = digits(text, 11, 2);
  const minute = digits(text, 14, 2);
  const second = digits(text, 17, 2);
  if (year < 1000 || month < 1 || month > 12 || day < 1 || day > 28 || hour < 0 || hour > 23) {
    return parseInstantSlow(text);
  }
  if (minute < 0 || minute > 59 || second < 0 || second > 59) return parseInstantSlow(text);
  let at = 19;
  let ms = 0;
  if (text.charCodeAt(at) === 46) {
    ms = digits(text, at + 1, 3);
    if (ms < 0) return parseInstantSlow(text);
    at += 4;
  }
  let offsetMinutes = 0;
  const zone = text.charCodeAt(at);
  if (zone === 90 && n === at + 1) {
    offsetMinutes = 0;
  } else if ((zone === 43 || zone === 45) && n === at + 6 && text.charCodeAt(at + 3) === 58) {
    const oh = digits(text, at + 1, 2);
    const om = digits(text, at + 4, 2);
    if (oh < 0 || oh > 23 || om < 0 || om > 59) return parseInstantSlow(text);
    offsetMinutes = (zone === 43 ? 1 : -1) * (oh * 60 + om);
  } else {
    return parseInstantSlow(text);
  }
  return Date.UTC(year, month - 1, day, hour, minute, second, ms) - offsetMinutes * 60_000;
}

const DAY_MS = 86_400_000;
const TWO_DIGITS = Array.from({ length: 60 }, (_, i) => String(i).padStart(2, '0'));
const THREE_DIGITS = Array.from({ length: 1000 }, (_, i) => String(i).padStart(3, '0'));

/**
 * Formats instants as `Date.prototype.toISOString` does, without the ".000" on a whole second. Keeps the
 * last day's "YYYY-MM-DDT" so a series (many instants a day) builds only the time of day per call.
 */
export function createInstantFormatter(): (ms: number) => string {
  let cachedDay = Number.NaN;
  let prefix = '';
  return (instant: number): string => {
    // A Date keeps whole milliseconds, truncated toward zero (TimeClip in ECMA-262).
    const ms = Number.isInteger(instant) ? instant : Math.trunc(instant);
    const day = Math.floor(ms / DAY_MS);
    if (day !== cachedDay) {
      // Throws RangeError for an invalid instant, as toISOString does.
      const text = new Date(day * DAY_MS).toISOString();
      if (text.length !== 24) return plainIso(ms); // years outside 0000-9999: the built-in form
      cachedDay = day;
      prefix = text.slice(0, 11);
    }
    const inDay = ms - cachedDay * DAY_MS;
    const millis = inDay % 1000;
    const secs = (inDay - millis) / 1000;
    if (millis === 0) return prefix + wholeSecondOfDay(secs);
    return `${prefix}${clockTime(secs)}.${THREE_DIGITS[millis]}Z`;
  };
}

/** "HH:MM:SS" of a second of the day. */
const clockTime = (secs: number) =>
  `${TWO_DIGITS[Math.floor(secs / 3600)]}:${TWO_DIGITS[Math.floor(secs / 60) % 60]}:${TWO_DIGITS[secs % 60]}`;

// "HH:MM:SSZ" per second of the day, made on first use: an instant on a whole second is then one join of two
// strings instead of six, which matters when a long series keeps every one alive (and JSON flattens them).
const SECONDS_OF_DAY: (string | undefined)[] = new Array(86_400).fill(undefined);
function wholeSecondOfDay(secs: number): string {
  let text = SECONDS_OF_DAY[secs];
  if (text === undefined) {
    text = `${clockTime(secs)}Z`;
    SECONDS_OF_DAY[secs] = text;
  }
  return text;
}

/** The reference format: toISOString without ".000". */
export function plainIso(ms: number): string {
  const text = new Date(ms).toISOString();
  return text.endsWith('.000Z') ? `${text.slice(0, -5)}Z` : text;
}
