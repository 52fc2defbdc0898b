import { describe, expect, it } from 'vitest';
import { commandOf, errorOf, exampleContext } from './exampleContext.js';

describe('add tank in one line', () => {
  it('reads a vertical cylinder with the keys of the tank specification', () => {
    expect(commandOf('add tank T5 vertical-cylinder diameter=48in length=72in unit=gal')).toEqual({
      type: 'add-tank',
      tank: 'T5',
      spec: { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 },
      awaitingRows: false,
      raw: 'add tank T5 vertical-cylinder diameter=48in length=72in unit=gal',
    });
  });

  it('converts every dimension to the first one`s unit (1 ft = 12 in exactly, NIST SP 811 appendix B)', () => {
    const command = commandOf(
      'add tank T5 horizontal diameter=4ft length=96in heads=ellipsoidal:6in,flat unit=gal',
    );
    expect(command).toMatchObject({
      spec: {
        units: { length: 'ft', volume: 'gal' },
        shape: 'horizontal-cylinder',
        diameter: 4,
        length: 8,
        heads: [{ type: 'ellipsoidal', depth: 0.5 }, { type: 'flat' }],
      },
    });
  });

  it('gives both ends one head when one is named, and reads torispherical parameters and inward bottoms', () => {
    expect(
      commandOf('add tank T6 horizontal-cylinder diameter=2m length=5m heads=ellipsoidal:0.5m unit=m3'),
    ).toMatchObject({
      spec: {
        heads: [
          { type: 'ellipsoidal', depth: 0.5 },
          { type: 'ellipsoidal', depth: 0.5 },
        ],
      },
    });
    expect(
      commandOf('add tank T6 vertical d=3m len=4m heads=conical:30cm:inward,torispherical:f=1:k=0.06 unit=L'),
    ).toMatchObject({
      spec: {
        heads: [
          { type: 'conical', depth: 0.3, inward: true },
          { type: 'torispherical', f: 1, k: 0.06 },
        ],
      },
    });
  });

  it('keeps the name, product and site words', () => {
    expect(
      commandOf(
        'add tank GEN-2 vertical diameter=48in length=72in unit=gal product=diesel site="Ridge Pump Station" name="Generator day tank"',
      ),
    ).toMatchObject({
      tank: 'GEN-2',
      product: 'diesel',
      site: 'Ridge Pump Station',
      name: 'Generator day tank',
    });
  });

  it('reads spheres and rectangular tanks', () => {
    expect(commandOf('add tank S1 sphere diameter=3m unit=m3')).toMatchObject({
      spec: { shape: 'sphere', diameter: 3, units: { length: 'm', volume: 'm3' } },
    });
    expect(commandOf('add tank B1 box width=1.2m length=2m height=1500mm unit=L')).toMatchObject({
      spec: { shape: 'rectangular', width: 1.2, length: 2, height: 1.5 },
    });
  });

  it('reads a strapping table pasted under the line; a cell may carry its own unit', () => {
    const text = 'add tank T10 strapping unit=L\n0,0\n50,400\n1 m,900\ndone';
    expect(commandOf(text)).toMatchObject({
      type: 'add-tank',
      spec: {
        shape: 'strapping',
        units: { length: 'cm', volume: 'L' },
        table: [
          [0, 0],
          [50, 400],
          [100, 900],
        ],
      },
      awaitingRows: false,
    });
  });

  it('takes the units a header names, through engine/geometry`s strapping CSV reader', () => {
    expect(
      commandOf('add tank T10 strapping unit=gal\nlevel_in,volume_gal\n0,0\n24,150\n48,310'),
    ).toMatchObject({
      spec: {
        units: { length: 'in', volume: 'gal' },
        table: [
          [0, 0],
          [24, 150],
          [48, 310],
        ],
      },
    });
    expect(commandOf('add tank T10 strapping unit=L\nlevel\tvolume\n0\t0\n50\t400')).toMatchObject({
      spec: {
        units: { length: 'cm', volume: 'L' },
        table: [
          [0, 0],
          [50, 400],
        ],
      },
    });
  });

  it('awaits the rows of a strapping table sent without them', () => {
    expect(commandOf('add tank T9b strapping unit=gal level=in')).toMatchObject({
      spec: { shape: 'strapping', units: { length: 'in', volume: 'gal' } },
      awaitingRows: true,
    });
  });

  it('starts a guided exchange for "add tank" alone', () => {
    expect(commandOf('add tank')).toEqual({ type: 'add-tank-guided' });
    expect(commandOf('new tank')).toEqual({ type: 'add-tank-guided' });
  });

  it.each([
    ['add tank T4 vertical-cylinder diameter=48in length=72in unit=gal', /already have a tank T4/],
    ['add tank T5 vertical-cylinder diameter=48in unit=gal', /needs length=/],
    ['add tank T5 vertical-cylinder diameter=48in length=72in', /unit=gal/],
    ['add tank T5 vertical-cylinder diamter=48in length=72in unit=gal', /did you mean diameter=/],
    ['add tank T5 cube diameter=48in unit=gal', /"cube" is not a shape/],
    ['add tank all vertical diameter=48in length=72in unit=gal', /bot's own words/],
    ['add tank Undo sphere diameter=1m unit=L', /bot's own words/],
    ['add tank T5 vertical-cylinder diameter=48in length=72in unit=in', /not a volume unit/],
    ['add tank T5 vertical-cylinder diameter=0in length=72in unit=gal', /more than 0/],
    ['add tank T5 sphere diameter=2m heads=flat unit=L', /has no heads/],
    ['add tank T5 vertical diameter=2m length=2m heads=bulbous:1m unit=L', /not a head type/],
    ['add tank T10 strapping unit=L\n0,0\n50,400\n40,500', /levels must rise/],
    ['add tank T10 strapping unit=L\n0,0\n50,abc', /Line 2/],
    ['add tank T10 strapping unit=L\n0,0', /at least two rows/],
    ['add tank T10 strapping unit=L\nlevel_in,volume_gal\n0,0\n24,150', /header says gal but L was given/],
    ['add tank T10 strapping unit=L\ndepth,litres\n0,0\n24,150', /`level_cm,volume_L`/],
    [
      'add tank T5 vertical diameter=2m length=2m unit=L\n0,0\n1,1',
      /Only a strapping tank takes table lines/,
    ],
  ])('%s is refused: %s', (text, message) => {
    expect(errorOf(text)).toMatch(message);
  });
});

describe('strapping rows and guided answers while the bot awaits them', () => {
  const awaitingRows = { ...exampleContext, awaiting: 'strapping-rows' as const };
  const awaitingAnswer = { ...exampleContext, awaiting: 'setup-answer' as const };

  it('reads rows, then done', () => {
    expect(commandOf('10,52.5\n20;110\n30\t170', awaitingRows)).toEqual({
      type: 'strapping-rows',
      rows: [
        [10, 52.5],
        [20, 110],
        [30, 170],
      ],
      done: false,
    });
    expect(commandOf('40,230\ndone', awaitingRows)).toEqual({
      type: 'strapping-rows',
      rows: [[40, 230]],
      done: true,
    });
    expect(commandOf('done', awaitingRows)).toEqual({ type: 'strapping-rows', rows: [], done: true });
  });

  it('skips a plain header and refuses one that names units it cannot check', () => {
    expect(commandOf('level\tvolume\n10\t52.5', awaitingRows)).toEqual({
      type: 'strapping-rows',
      rows: [[10, 52.5]],
      done: false,
    });
    expect(commandOf('level,volume\n10,52.5', awaitingRows)).toEqual({
      type: 'strapping-rows',
      rows: [[10, 52.5]],
      done: false,
    });
    expect(errorOf('level_in,volume_gal\n10,52.5', awaitingRows)).toMatch(/Leave out the header/);
  });

  it('lets other commands through and refuses a broken row', () => {
    expect(commandOf('T4 60in', awaitingRows)).toMatchObject({ type: 'reading' });
    expect(commandOf('cancel', awaitingRows)).toEqual({ type: 'cancel' });
    expect(errorOf('10,fifty', awaitingRows)).toMatch(/Line 1.*`done`/);
  });

  it('hands any answer of a guided exchange to the bot, except cancel and help', () => {
    expect(commandOf('vertical cylinder', awaitingAnswer)).toEqual({
      type: 'setup-answer',
      text: 'vertical cylinder',
    });
    expect(commandOf('48 in', awaitingAnswer)).toEqual({ type: 'setup-answer', text: '48 in' });
    expect(commandOf('cancel', awaitingAnswer)).toEqual({ type: 'cancel' });
    expect(commandOf('help setup', awaitingAnswer)).toEqual({ type: 'help', topic: 'setup' });
  });
});

describe('remove and rename', () => {
  it.each([
    ['remove tank T4', { type: 'remove-tank', tank: 'T4' }],
    ['delete tank north yard 2', { type: 'remove-tank', tank: 'North Yard 2' }],
    ['rename tank T4 to GEN-2', { type: 'rename-tank', tank: 'T4', newName: 'GEN-2' }],
    ['rename T4 DAY-1', { type: 'rename-tank', tank: 'T4', newName: 'DAY-1' }],
  ])('%s', (text, expected) => {
    expect(commandOf(text)).toEqual(expected);
  });

  it.each([
    ['remove tank T5', /Did you mean T4\?/],
    ['rename tank T4 to T9', /already a tank T9/],
    ['rename tank T4 to ???', /cannot be a tank code/],
    ['rename tank T4 to status', /cannot be a tank code/],
  ])('%s is refused: %s', (text, message) => {
    expect(errorOf(text)).toMatch(message);
  });
});
