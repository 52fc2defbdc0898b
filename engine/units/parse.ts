import { closest, distance } from 'fastest-levenshtein';
import { fail, ok, type Result } from '../result.js';
import { type LengthUnit, METRES_PER, type TimeUnit, type VolumeUnit } from './definitions.js';

export type QuantityKind = 'length' | 'volume' | 'percent' | 'flow' | 'time';

/** A number with its unit as typed; `unit` is the canonical id ("in", "gal", "%", "gal/min", "h"). */
export interface Quantity {
  kind: QuantityKind;
  value: number;
  unit: string;
}

export type ParsedUnit =
  | { kind: 'length'; unit: LengthUnit }
  | { kind: 'volume'; unit: VolumeUnit }
  | { kind: 'time'; unit: TimeUnit }
  | { kind: 'percent'; unit: '%' }
  | { kind: 'flow'; unit: string; volume: VolumeUnit; time: TimeUnit };

// Words people type for each unit. "gallon" alone means the US gallon (common practice in North America);
// the imperial gallon must be asked for by name.
const LENGTH_WORDS: Record<LengthUnit, string[]> = {
  mm: ['mm', 'millimetre', 'millimetres', 'millimeter', 'millimeters'],
  cm: ['cm', 'centimetre', 'centimetres', 'centimeter', 'centimeters'],
  m: ['m', 'metre', 'metres', 'meter', 'meters', 'mtr'],
  in: ['in', 'inch', 'inches', '"', '″', "''"],
  ft: ['ft', 'foot', 'feet', "'", '′'],
};
const VOLUME_WORDS: Record<VolumeUnit, string[]> = {
  L: ['l', 'litre', 'litres', 'liter', 'liters', 'ltr', 'ltrs', 'lt'],
  m3: ['m3', 'm³', 'm^3', 'cubic metre', 'cubic metres', 'cubic meter', 'cubic meters', 'cu m'],
  gal: ['gal', 'gals', 'gallon', 'gallons', 'us gal', 'us gallon', 'us gallons', 'usg'],
  impgal: ['impgal', 'imp gal', 'imperial gallon', 'imperial gallons', 'imp gallon', 'imp gallons', 'uk gal'],
  bbl: ['bbl', 'bbls', 'barrel', 'barrels'],
  ft3: ['ft3', 'ft³', 'ft^3', 'cu ft', 'cubic foot', 'cubic feet', 'cf'],
  in3: ['in3', 'in³', 'in^3', 'cu in', 'cubic inch', 'cubic inches'],
};
const TIME_WORDS: Record<TimeUnit, string[]> = {
  s: ['s', 'sec', 'secs', 'second', 'seconds'],
  min: ['min', 'mins', 'minute', 'minutes'],
  h: ['h', 'hr', 'hrs', 'hour', 'hours'],
  d: ['d', 'day', 'days'],
};
const PERCENT_WORDS = ['%', 'percent', 'pct', 'per cent'];
// Trade shorthands for flows (common practice).
const FLOW_WORDS: Record<string, [VolumeUnit, TimeUnit]> = {
  gpm: ['gal', 'min'],
  gph: ['gal', 'h'],
  gpd: ['gal', 'd'],
  lpm: ['L', 'min'],
  lph: ['L', 'h'],
  lpd: ['L', 'd'],
  bpd: ['bbl', 'd'],
};
// Words that name more than one unit: refuse them and say which to write instead.
const AMBIGUOUS: Record<string, string> = {
  g: 'it could mean grams or gallons; write "gal"',
  gl: 'write "gal" for US gallons or "impgal" for imperial gallons',
  cu: 'write "m3", "ft3" or "in3"',
  c: 'write "cm"',
};

const WORD_TO_UNIT = new Map<string, ParsedUnit>();
for (const [unit, words] of Object.entries(LENGTH_WORDS))
  for (const w of words) WORD_TO_UNIT.set(w, { kind: 'length', unit: unit as LengthUnit });
for (const [unit, words] of Object.entries(VOLUME_WORDS))
  for (const w of words) WORD_TO_UNIT.set(w, { kind: 'volume', unit: unit as VolumeUnit });
for (const [unit, words] of Object.entries(TIME_WORDS))
  for (const w of words) WORD_TO_UNIT.set(w, { kind: 'time', unit: unit as TimeUnit });
for (const w of PERCENT_WORDS) WORD_TO_UNIT.set(w, { kind: 'percent', unit: '%' });
for (const [w, [volume, time]] of Object.entries(FLOW_WORDS))
  WORD_TO_UNIT.set(w, { kind: 'flow', unit: `${volume}/${time}`, volume, time });
const KNOWN_WORDS = [...WORD_TO_UNIT.keys()].filter((w) => /^[a-z]/.test(w));

const normalise = (word: string): string =>
  word
    .trim()
    .toLowerCase()
    .replace(/\s+/g, ' ')
    .replace(/\.$/, '')
    .replace(/^us\.? /, 'us ');

function unknownUnit(word: string): { ok: false; error: string } {
  const w = normalise(word);
  const hint = AMBIGUOUS[w];
  if (hint) return fail(`"${word.trim()}" is ambiguous as a unit: ${hint}`);
  const near = closest(w, KNOWN_WORDS);
  const suggestion =
    distance(w, near) <= Math.max(2, Math.floor(w.length / 2)) ? `; did you mean "${near}"?` : '';
  return fail(`"${word.trim()}" is not a unit I know${suggestion} (try in, ft, cm, m, L, gal, bbl, m3, %)`);
}

/** Reads a unit word: "inches", "gal", "m³", "%", "gal/min", "L per hour", "gpm". */
export function parseUnit(word: string): Result<ParsedUnit> {
  const w = normalise(word);
  if (w === '') return fail('a unit is missing (for example in, cm, gal, L or %)');
  const direct = WORD_TO_UNIT.get(w);
  if (direct) return ok(direct);
  const perMatch = /^(.+?)\s*(?:\/|\bper\b|\ba\b)\s*(.+)$/.exec(w);
  if (perMatch) {
    const volume = WORD_TO_UNIT.get(normalise(perMatch[1] ?? ''));
    const time = WORD_TO_UNIT.get(normalise(perMatch[2] ?? ''));
    if (volume?.kind !== 'volume') return unknownUnit(perMatch[1] ?? '');
    if (time?.kind !== 'time') return unknownUnit(perMatch[2] ?? '');
    return ok({ kind: 'flow', unit: `${volume.unit}/${time.unit}`, volume: volume.unit, time: time.unit });
  }
  return unknownUnit(word);
}

// A number as people type it: optional sign, thousands separated by commas, decimals, exponent.
const NUMBER = /\s*([+-]?(?:\d{1,3}(?:,\d{3})+|\d+)?(?:\.\d+)?(?:e[+-]?\d+)?)/iy;

/**
 * The unit text after a number, up to the next number: a 2 or 3 glued to a letter stays with the unit
 * ("m3", "ft3", "m^3"), and so does a point that no digit follows ("60 in.").
 */
function readUnitText(source: string, start: number): { word: string; end: number } {
  let i = start;
  for (; i < source.length; i++) {
    const c = source[i]!;
    const next = source[i + 1] ?? '';
    if (c >= '0' && c <= '9') {
      const glued =
        (c === '2' || c === '3') && i > start && /[a-z^]/i.test(source[i - 1]!) && !/[\d.,]/.test(next);
      if (!glued) break;
    } else if (c === '+' || c === '-' || (c === '.' && /\d/.test(next))) break;
  }
  return { word: source.slice(start, i).trim(), end: i };
}

/**
 * Reads a number with a unit: "62in", "62\"", "5' 2\"", "5ft 2in", "1.57 m", "48%", "1,550 L", "1.2 m³",
 * "3 gpm". Lengths given in parts are summed in the smallest unit written ("5' 2\"" is 62 in).
 */
export function parseQuantity(text: string): Result<Quantity> {
  const parts: { value: number; unit: ParsedUnit; word: string }[] = [];
  let pos = 0;
  const source = text.trim();
  if (source === '') return fail('nothing to read: give a number with a unit, for example 62 in or 410 gal');
  while (pos < source.length) {
    NUMBER.lastIndex = pos;
    const num = NUMBER.exec(source);
    const digits = num?.[1] ?? '';
    if (!num || !/\d/.test(digits)) return fail(`"${text.trim()}" has no number where one was expected`);
    pos = NUMBER.lastIndex;
    const unitText = readUnitText(source, pos);
    const word = unitText.word;
    pos = unitText.end;
    const value = Number(digits.replace(/,/g, ''));
    if (!Number.isFinite(value)) return fail(`"${digits}" is not a number I can use`);
    const unit = parseUnit(word);
    if (!unit.ok) return unit;
    parts.push({ value, unit: unit.value, word });
  }
  return combineParts(parts, text.trim());
}

function combineParts(
  parts: { value: number; unit: ParsedUnit; word: string }[],
  text: string,
): Result<Quantity> {
  const [first] = parts;
  if (!first) return fail(`"${text}" has no number`);
  if (parts.length === 1) return ok({ kind: first.unit.kind, value: first.value, unit: first.unit.unit });
  // Only lengths come in parts (feet and inches, metres and centimetres).
  if (parts.some((p) => p.unit.kind !== 'length'))
    return fail(`"${text}" mixes several quantities; give one number with one unit`);
  const scale = METRES_PER;
  const units = parts.map((p) => p.unit.unit as LengthUnit);
  const smallest = units.reduce((a, b) => (scale[b] < scale[a] ? b : a));
  if (new Set(units).size !== units.length || parts.some((p, i) => i > 0 && p.value < 0))
    return fail(`"${text}" repeats a unit or has a sign inside; write it like 5 ft 2 in`);
  let total = 0;
  for (const p of parts) total += (p.value * scale[p.unit.unit as LengthUnit]) / scale[smallest];
  // Round away the binary noise of the unit ratio (12 in to the foot is exact in decimal).
  return ok({ kind: 'length', value: Number(total.toPrecision(15)), unit: smallest });
}
