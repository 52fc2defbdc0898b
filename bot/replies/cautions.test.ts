import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cautionFor, gaugeFirstNote, hazardOf } from './cautions.js';

// The hazard classes and wording are common practice for fuels, LPG and water-treatment chemicals; no
// regulation is cited because the governing code differs by place.
describe('hazardOf', () => {
  it.each([
    ['Diesel #2', 'fuel'],
    ['ULSD', 'fuel'],
    ['gasoline', 'fuel'],
    ['heating oil', 'fuel'],
    ['Propane', 'lpg'],
    ['LPG bullet', 'lpg'],
    ['12.5% sodium hypochlorite', 'hypochlorite'],
    ['bleach', 'hypochlorite'],
    ['sulfuric acid 93%', 'acid'],
    ['fluorosilicic acid', 'acid'],
    ['caustic soda 50%', 'caustic'],
    ['sodium hydroxide', 'caustic'],
    ['ferric chloride', 'chemical'],
    ['potable water', 'none'],
    ['wastewater', 'none'],
    ['', 'none'],
  ])('%s -> %s', (product, hazard) => {
    expect(hazardOf(product)).toBe(hazard);
  });

  it('needs whole words, so a tank called "Hypothetical" is not hypochlorite', () => {
    expect(hazardOf('Hypothetical reservoir')).toBe('none');
  });
});

describe('cautionFor', () => {
  it('says nothing for water in an ordinary reading', () => {
    expect(cautionFor('water')).toBeUndefined();
    expect(cautionFor(undefined, 'low')).toBeUndefined();
  });

  it('warns of overfill for every tank, water included', () => {
    const text = cautionFor('water', 'overfill');
    expect(text).toMatch(/safe fill/);
    expect(text).toMatch(/local codes/);
  });

  it('keeps hypochlorite away from acids and names the safety data sheet', () => {
    const text = cautionFor('sodium hypochlorite') ?? '';
    expect(text).toMatch(/acids/);
    expect(text).toMatch(/safety data sheet/);
  });

  it('sends LPG filling to a licensed supplier', () => {
    expect(cautionFor('propane')).toMatch(/licensed supplier/);
  });

  it('adds the delivery check to a hazardous product at a delivery', () => {
    expect(cautionFor('diesel', 'delivery')).toMatch(/room left in the tank/);
    expect(cautionFor('diesel', 'reading')).not.toMatch(/room left in the tank/);
  });

  it('always defers to local codes, stays brief and cites no invented regulation numbers (property)', () => {
    const products = fc.oneof(
      fc.constantFrom('diesel', 'propane', 'bleach', 'hydrochloric acid', 'lye', 'alum', 'water'),
      fc.string(),
    );
    const situations = fc.constantFrom('reading', 'delivery', 'overfill', 'low' as const);
    fc.assert(
      fc.property(products, situations, (product, situation) => {
        const text = cautionFor(product, situation);
        if (text === undefined) return;
        expect(text).toMatch(/local codes/);
        expect(text.length).toBeLessThan(400);
        expect(text).not.toMatch(/\d/);
      }),
    );
  });
});

describe('gaugeFirstNote', () => {
  // Common practice: a forecast quantity is checked against a gauge reading before the product is moved.
  it('tells the crew to gauge first, for a fill and for a pick-up', () => {
    expect(gaugeFirstNote('order')).toMatch(/^gauge the tank before filling/);
    expect(gaugeFirstNote('pick-up')).toMatch(/^gauge the tank before the pick-up/);
    expect(gaugeFirstNote('order')).toMatch(/estimate/);
  });
});
