import { describe, expect, it } from 'vitest';
import { commandOf, errorOf, exampleContext } from './exampleContext.js';

const utc = (iso: string): number => Date.parse(iso);

describe('readings', () => {
  it.each([
    ['T4 60in', { kind: 'level', length: { value: 60, unit: 'in', raw: '60in' } }],
    [`T4 5' 2"`, { kind: 'level', length: { value: 62, unit: 'in', raw: `5' 2"` } }],
    ['T4 5\u2019 2\u201D', { kind: 'level', length: { value: 62, unit: 'in', raw: `5' 2"` } }],
    ['T4 157 cm', { kind: 'level', length: { value: 157, unit: 'cm', raw: '157 cm' } }],
    ['T4 48%', { kind: 'percent', percent: 48, raw: '48%' }],
    ['T4 410 gal', { kind: 'volume', volume: { value: 410, unit: 'gal', raw: '410 gal' } }],
    ['T4 0.5 m3', { kind: 'volume', volume: { value: 0.5, unit: 'm3', raw: '0.5 m3' } }],
    ['T4 12ft3', { kind: 'volume', volume: { value: 12, unit: 'ft3', raw: '12ft3' } }],
    ['T4 60 in.', { kind: 'level', length: { value: 60, unit: 'in', raw: '60 in.' } }],
    ['T4 ullage 14in', { kind: 'ullage', length: { value: 14, unit: 'in', raw: '14in' } }],
    ['North Yard 2 1,550 L', { kind: 'volume', volume: { value: 1550, unit: 'L', raw: '1,550 L' } }],
  ])('%s', (text, measurement) => {
    const command = commandOf(text);
    expect(command).toMatchObject({ type: 'reading', measurement });
    expect(command.type === 'reading' && command.raw).toBe(
      text.replace('\u2019', "'").replace('\u201D', '"'),
    );
  });

  it.each(['T4 at 60in', 'T4: 60in', 'T4 is 60in', 'T4 reads 60in', 'T4 level 60in', 'T4 60in,'])(
    '%s is a level of 60 in',
    (text) => {
      expect(commandOf(text)).toMatchObject({
        type: 'reading',
        measurement: { kind: 'level', length: { value: 60, unit: 'in' } },
      });
    },
  );

  it('reads a time after a comma', () => {
    expect(commandOf('T4 60in, at 7:30')).toMatchObject({ time: { at: utc('2026-11-10T13:30:00Z') } });
  });

  it('reads a tank whose name starts with a command word as the tank', () => {
    const context = { ...exampleContext, tankNames: ['delivery-1', 'Set-2', 'Help-3'] };
    expect(commandOf('delivery-1 60in', context)).toMatchObject({ type: 'reading', tank: 'delivery-1' });
    expect(commandOf('Set-2 +40 gal', context)).toMatchObject({ type: 'delivery', tank: 'Set-2' });
    expect(commandOf('delivery-1?', context)).toEqual({ type: 'tank-question', tank: 'delivery-1' });
    expect(commandOf('how long does Set-2 last?', context)).toEqual({ type: 'tank-question', tank: 'Set-2' });
    expect(commandOf('help-3 48%', context)).toMatchObject({ type: 'reading', tank: 'Help-3' });
    expect(commandOf('help', context)).toEqual({ type: 'help' });
  });

  it('answers in the team spelling of the tank name', () => {
    expect(commandOf('t4 60 in')).toMatchObject({ type: 'reading', tank: 'T4' });
    expect(commandOf('north yard 2 48%')).toMatchObject({ type: 'reading', tank: 'North Yard 2' });
  });

  // America/Chicago is on CST (UTC-6) after 2026-11-01 (US rule: DST ends the first Sunday of November; from memory, as kept in the IANA tz database).
  it.each([
    ['T4 60in at 7:30', '2026-11-10T13:30:00Z', 'at 7:30'],
    ['T4 60in yesterday 4pm', '2026-11-09T22:00:00Z', 'yesterday 4pm'],
    ['T4 60in at 2026-11-02 07:30', '2026-11-02T13:30:00Z', 'at 2026-11-02 07:30'],
    ['T4 60in at 2026-11-02T07:30+01:00', '2026-11-02T06:30:00Z', 'at 2026-11-02T07:30+01:00'],
    ['T4 48% monday 8am', '2026-11-09T14:00:00Z', 'monday 8am'],
    ['T4 ullage 14in 2 hours ago', '2026-11-10T13:00:00Z', '2 hours ago'],
  ])('%s happened at %s', (text, iso, raw) => {
    expect(commandOf(text)).toMatchObject({ type: 'reading', time: { at: utc(iso), raw } });
  });

  it('leaves the time out when none is given (the bot uses the arrival time)', () => {
    const command = commandOf('T4 60in');
    expect(command.type === 'reading' && command.time).toBeUndefined();
  });

  it.each([
    ['T4 60', /unit is missing/],
    ['T4 60 furlongs', /"furlongs" is not a unit/],
    ['T4 120%', /between 0% and 100%/],
    ['T4 -5in', /cannot be negative/],
    ['T4 3 gpm', /not a reading/],
    ['T4 60in at 11pm', /still to come/],
    ['T4 60in at half past nowhere', /could not read/],
    ['T5 60in', /Did you mean T4\?/],
    ['Zed 60in', /no tank named "Zed" \(the nearest is T\d\)/],
  ])('%s is refused: %s', (text, message) => {
    expect(errorOf(text)).toMatch(message);
  });

  it('asks for the first tank when the team has none', () => {
    expect(errorOf('T4 60in', { ...exampleContext, tankNames: [] })).toMatch(/add tank T4/);
  });
});

describe('deliveries', () => {
  it.each([
    ['delivered 150 gal to T4', { tank: 'T4', volume: { value: 150, unit: 'gal', raw: '150 gal' } }],
    ['T4 +400 gal', { tank: 'T4', volume: { value: 400, unit: 'gal', raw: '400 gal' } }],
    ['T4 delivered 400 gal', { tank: 'T4', volume: { value: 400, unit: 'gal' } }],
    ['delivered to T4 400 gal', { tank: 'T4', volume: { value: 400, unit: 'gal' } }],
    ['delivery North Yard 2 2000 L', { tank: 'North Yard 2', volume: { value: 2000, unit: 'L' } }],
    ['delivery of 2,000 L to North Yard 2', { tank: 'North Yard 2', volume: { value: 2000, unit: 'L' } }],
    ['delivered 150 gal to T4 ticket 8812', { tank: 'T4', ticket: '8812' }],
    [
      'delivered 400 gal to T4 level 61in',
      { levelAfter: { kind: 'level', length: { value: 61, unit: 'in' } } },
    ],
    [
      'delivered 150 gal to T4 ticket 8812 level after 61in at 2026-11-06 10:00',
      {
        ticket: '8812',
        levelAfter: { kind: 'level', length: { value: 61, unit: 'in' } },
        time: { at: utc('2026-11-06T16:00:00Z') },
      },
    ],
    [
      'T4 +400 gal at 2026-11-06 10:00 ticket A-77 level after 80%',
      {
        ticket: 'A-77',
        levelAfter: { kind: 'percent', percent: 80 },
        time: { at: utc('2026-11-06T16:00:00Z') },
      },
    ],
  ])('%s', (text, expected) => {
    expect(commandOf(text)).toMatchObject({ type: 'delivery', raw: text, ...expected });
  });

  it.each([
    ['delivered 150 gal to T5', /Did you mean T4\?/],
    ['delivered 150 in to T4', /not a volume/],
    ['T4 +0 gal', /adds nothing/],
    ['delivered lots', /`delivered 150 gal to T4`/],
    ['delivered 150 gal to T4 level after 30 gal', /is a level/],
  ])('%s is refused: %s', (text, message) => {
    expect(errorOf(text)).toMatch(message);
  });
});

describe('questions', () => {
  it.each([
    ['T4?', { type: 'tank-question', tank: 'T4' }],
    ['t4 ?', { type: 'tank-question', tank: 'T4' }],
    ['T4 status', { type: 'tank-question', tank: 'T4' }],
    ['status T4', { type: 'tank-question', tank: 'T4' }],
    ['how long does T4 last?', { type: 'tank-question', tank: 'T4' }],
    ['how long will North Yard 2 last', { type: 'tank-question', tank: 'North Yard 2' }],
    ['when does GEN-1 run out?', { type: 'tank-question', tank: 'GEN-1' }],
    ['how much is left in T4?', { type: 'tank-question', tank: 'T4' }],
    ['how much in north yard 2', { type: 'tank-question', tank: 'North Yard 2' }],
    ['runway T4', { type: 'tank-question', tank: 'T4' }],
    ['T4 runway?', { type: 'tank-question', tank: 'T4' }],
    ['all', { type: 'overview' }],
    ['status', { type: 'overview' }],
    ['All?', { type: 'overview' }],
  ])('%s', (text, expected) => {
    expect(commandOf(text)).toEqual(expected);
  });

  // 2026-11-10 is a Tuesday; the ISO week ends Sunday 2026-11-15 23:59:59.999 CST = 2026-11-16T05:59:59.999Z.
  it.each([
    ['which tanks run low this week?', '2026-11-16T05:59:59.999Z', 'this week'],
    ['what runs low today', '2026-11-11T05:59:59.999Z', 'today'],
    ['which tanks will run low tomorrow?', '2026-11-12T05:59:59.999Z', 'tomorrow'],
    ['which tanks run low in 10 days?', '2026-11-20T15:00:00.000Z', 'the next 10 days'],
    ['low this week', '2026-11-16T05:59:59.999Z', 'this week'],
    ['which tanks run low?', '2026-11-17T15:00:00.000Z', 'the next 7 days'],
    ['anything running low this week?', '2026-11-16T05:59:59.999Z', 'this week'],
    ['what needs ordering?', '2026-11-17T15:00:00.000Z', 'the next 7 days'],
    ['which tanks should we refill tomorrow', '2026-11-12T05:59:59.999Z', 'tomorrow'],
  ])('%s -> until %s', (text, iso, window) => {
    expect(commandOf(text)).toEqual({ type: 'running-low', until: utc(iso), window });
  });

  it('refuses a window it cannot read and a question about an unknown tank', () => {
    expect(errorOf('which tanks run low whenever')).toMatch(/could not read the window/);
    expect(errorOf('how long does T5 last?')).toMatch(/Did you mean T4\?/);
  });
});
