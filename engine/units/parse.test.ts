import { describe, expect, it } from 'vitest';
import { parseQuantity, parseUnit } from './index.js';

const value = (text: string) => {
  const r = parseQuantity(text);
  if (!r.ok) throw new Error(r.error);
  return r.value;
};
const error = (text: string) => {
  const r = parseQuantity(text);
  if (r.ok) throw new Error(`expected an error for ${text}`);
  return r.error;
};

describe('parseQuantity', () => {
  it('reads what people type', () => {
    expect(value('62in')).toEqual({ kind: 'length', value: 62, unit: 'in' });
    expect(value('62"')).toEqual({ kind: 'length', value: 62, unit: 'in' });
    expect(value('5\' 2"')).toEqual({ kind: 'length', value: 62, unit: 'in' });
    expect(value('5ft 2in')).toEqual({ kind: 'length', value: 62, unit: 'in' });
    expect(value('5 feet 2 inches')).toEqual({ kind: 'length', value: 62, unit: 'in' });
    expect(value('1.57 m')).toEqual({ kind: 'length', value: 1.57, unit: 'm' });
    expect(value('1 m 20 cm')).toEqual({ kind: 'length', value: 120, unit: 'cm' });
    expect(value('157cm')).toEqual({ kind: 'length', value: 157, unit: 'cm' });
    expect(value('48%')).toEqual({ kind: 'percent', value: 48, unit: '%' });
    expect(value('410 gal')).toEqual({ kind: 'volume', value: 410, unit: 'gal' });
    expect(value('410 gallons')).toEqual({ kind: 'volume', value: 410, unit: 'gal' });
    expect(value('1,550 L')).toEqual({ kind: 'volume', value: 1550, unit: 'L' });
    expect(value('1.2 m³')).toEqual({ kind: 'volume', value: 1.2, unit: 'm3' });
    expect(value('12 bbl')).toEqual({ kind: 'volume', value: 12, unit: 'bbl' });
    expect(value('3 gpm')).toEqual({ kind: 'flow', value: 3, unit: 'gal/min' });
    expect(value('40 L/h')).toEqual({ kind: 'flow', value: 40, unit: 'L/h' });
    expect(value('2 barrels per day')).toEqual({ kind: 'flow', value: 2, unit: 'bbl/d' });
    expect(value('3 h')).toEqual({ kind: 'time', value: 3, unit: 'h' });
    expect(value('.5 imperial gallons')).toEqual({ kind: 'volume', value: 0.5, unit: 'impgal' });
    expect(value('0.5 m3')).toEqual({ kind: 'volume', value: 0.5, unit: 'm3' });
    expect(value('12 ft3')).toEqual({ kind: 'volume', value: 12, unit: 'ft3' });
    expect(value('2 m^3')).toEqual({ kind: 'volume', value: 2, unit: 'm3' });
    expect(value('60 in.')).toEqual({ kind: 'length', value: 60, unit: 'in' });
    expect(value('1e3 L')).toEqual({ kind: 'volume', value: 1000, unit: 'L' });
  });

  it('names an unknown unit and suggests the nearest one', () => {
    expect(error('62 inchs')).toMatch(/"inchs".*"inch/);
    expect(error('410 galons')).toMatch(/"galons".*did you mean "gallons"/);
    expect(error('5 furlongs')).toMatch(/"furlongs" is not a unit/);
  });

  it('refuses ambiguous units, missing units and malformed numbers', () => {
    expect(error('410 g')).toMatch(/ambiguous.*gal/);
    expect(error('62')).toMatch(/unit is missing/);
    expect(error('')).toMatch(/nothing to read/);
    expect(error('gal')).toMatch(/no number/);
    expect(error('3 gal 4 L')).toMatch(/mixes/);
    expect(error('5 ft 5 ft')).toMatch(/repeats/);
    expect(error('1,55 L')).toBeTypeOf('string');
  });

  it('reads back any amount written with any unit id, glued or spaced (fast-check)', async () => {
    const fc = (await import('fast-check')).default;
    const ids = [
      'mm',
      'cm',
      'm',
      'in',
      'ft',
      'L',
      'm3',
      'gal',
      'impgal',
      'bbl',
      'ft3',
      'in3',
      '%',
      'gal/min',
      'L/h',
      'bbl/d',
    ];
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e9, noNaN: true }),
        fc.constantFrom(...ids),
        fc.constantFrom('', ' '),
        (x, unit, gap) => {
          const r = parseQuantity(`${x}${gap}${unit}`);
          expect(r.ok && r.value.unit).toBe(unit);
          expect(r.ok && r.value.value).toBe(x);
        },
      ),
    );
  });

  it('never throws on arbitrary text', async () => {
    const fc = (await import('fast-check')).default;
    fc.assert(
      fc.property(fc.string({ maxLength: 40 }), (s) => {
        const r = parseQuantity(s);
        return r.ok ? Number.isFinite(r.value.value) : r.error.length > 0;
      }),
    );
  });
});

describe('parseUnit', () => {
  it('reads flows written with a slash or "per"', () => {
    const r = parseUnit('gal per min');
    expect(r.ok && r.value).toEqual({ kind: 'flow', unit: 'gal/min', volume: 'gal', time: 'min' });
  });
  it('names the part of a flow it did not understand', () => {
    const r = parseUnit('gal/fortnight');
    expect(r.ok ? '' : r.error).toMatch(/"fortnight"/);
  });
});
