import { describe, expect, it } from 'vitest';
import { commandOf, errorOf } from './exampleContext.js';

describe('settings', () => {
  it.each([
    ['set T4 threshold 20%', { key: 'threshold', threshold: { percent: 20 } }],
    [
      'set T4 threshold 150 gal',
      { key: 'threshold', threshold: { volume: { value: 150, unit: 'gal', raw: '150 gal' } } },
    ],
    ['set T4 threshold 5 days', { key: 'threshold', threshold: { runwayDays: 5 } }],
    ['set T4 reorder point 25 percent', { key: 'threshold', threshold: { percent: 25 } }],
    ['set T4 lead time 3 business days', { key: 'lead-time', days: 3, businessDays: true }],
    ['set T4 lead time 2 days', { key: 'lead-time', days: 2, businessDays: false }],
    [
      'set T4 lead time 3 working days cutoff 14:00',
      { key: 'lead-time', days: 3, businessDays: true, cutoffHour: 14 },
    ],
    ['set T4 cutoff noon', { key: 'order-cutoff', hour: 12 }],
    ['set T4 order cut-off 2pm', { key: 'order-cutoff', hour: 14 }],
    ['set T4 delivery days tue,thu', { key: 'delivery-days', weekdays: [2, 4] }],
    ['set T4 delivery days mon-wed, fri', { key: 'delivery-days', weekdays: [1, 2, 3, 5] }],
    ['set T4 delivery days weekdays', { key: 'delivery-days', weekdays: [1, 2, 3, 4, 5] }],
    ['set T4 delivery hours 8-12', { key: 'delivery-hours', from: 8, to: 12 }],
    ['set T4 delivery window 8am to noon', { key: 'delivery-hours', from: 8, to: 12 }],
    ['set T4 delivery hours 13:00-midnight', { key: 'delivery-hours', from: 13, to: 24 }],
    ['set T4 minimum order 100 gal', { key: 'minimum-order', volume: { value: 100, unit: 'gal' } }],
    ['set T4 order increment 50 gal', { key: 'order-increment', volume: { value: 50, unit: 'gal' } }],
    ['set T4 safe fill 90%', { key: 'safe-fill', percent: 90 }],
    ['set T4 product diesel', { key: 'product', product: 'diesel' }],
    ['set North Yard 2 site "Ridge Pump Station"', { key: 'site', site: 'Ridge Pump Station' }],
  ])('%s', (text, setting) => {
    const command = commandOf(text);
    expect(command).toMatchObject({ type: 'set', setting, raw: text });
    expect(command.type === 'set' && command.tank).toBeTruthy();
  });

  it.each([
    ['set time zone America/Chicago', { key: 'time-zone', timeZone: 'America/Chicago' }],
    ['set timezone Europe/Berlin', { key: 'time-zone', timeZone: 'Europe/Berlin' }],
    [
      'set digest 07:00 weekdays here',
      { key: 'digest', time: '07:00', weekdays: [1, 2, 3, 4, 5], channel: 'here' },
    ],
    [
      'set digest 7am daily #ops',
      { key: 'digest', time: '07:00', weekdays: [1, 2, 3, 4, 5, 6, 7], channel: '#ops' },
    ],
    ['set digest 6:30 pm mon,fri', { key: 'digest', time: '18:30', weekdays: [1, 5], channel: 'here' }],
    ['set digest off', { key: 'digest-off' }],
    [
      'set digest 07:00 weekdays in #ops',
      { key: 'digest', time: '07:00', weekdays: [1, 2, 3, 4, 5], channel: '#ops' },
    ],
    [
      'set digest at 6am mon-fri here',
      { key: 'digest', time: '06:00', weekdays: [1, 2, 3, 4, 5], channel: 'here' },
    ],
  ])('%s is a team setting', (text, setting) => {
    const command = commandOf(text);
    expect(command).toMatchObject({ type: 'set', setting });
    expect(command.type === 'set' && command.tank).toBeUndefined();
  });

  it.each([
    ['set T4 threshold lots', /percent, a volume or days/],
    ['set T4 threshold 120%', /between 0% and 100%/],
    ['set T4 lead time soon', /in days/],
    ['set T4 delivery days someday', /"someday" is not a day/],
    ['set T4 delivery hours noon-8', /after it opens/],
    ['set T4 delivery hours 8:30-12', /not an hour/],
    ['set T4 delivery hours mornings', /two whole hours/],
    ['set T4 safe fill 0%', /out of range|check/],
    ['set T4 colour blue', /do not know the setting/],
    ['set T5 threshold 20%', /Did you mean T4\?/],
    ['set threshold 20%', /Name the tank first/],
    ['set time zone Mars/Olympus', /not a time zone I know/],
    ['set digest 25:00', /not a time of day/],
    ['set T4 cutoff 14:30', /not an hour/],
  ])('%s is refused: %s', (text, message) => {
    expect(errorOf(text)).toMatch(message);
  });
});

describe('corrections, answers, digest and help', () => {
  it.each([
    ['undo', { type: 'undo' }],
    ['Undo.', { type: 'undo' }],
    [
      'delete the 7:30 reading',
      { type: 'delete-reading', hour: 7, minute: 30, raw: 'delete the 7:30 reading' },
    ],
    ['delete the 7:30 reading of T4', { type: 'delete-reading', tank: 'T4', hour: 7, minute: 30 }],
    ["delete T4's 4pm reading", { type: 'delete-reading', tank: 'T4', hour: 16, minute: 0 }],
    ['that was cm', { type: 'correct-unit', unit: { kind: 'length', unit: 'cm' }, raw: 'that was cm' }],
    ['it was in inches', { type: 'correct-unit', unit: { kind: 'length', unit: 'in' } }],
    ['I meant gallons', { type: 'correct-unit', unit: { kind: 'volume', unit: 'gal' } }],
    ['that was percent', { type: 'correct-unit', unit: { kind: 'percent' } }],
    ['that should have been mm', { type: 'correct-unit', unit: { kind: 'length', unit: 'mm' } }],
    ['yes', { type: 'confirm', answer: true }],
    ['No', { type: 'confirm', answer: false }],
    ['digest now', { type: 'digest-now' }],
    ['help', { type: 'help' }],
    ['help readings', { type: 'help', topic: 'readings' }],
    ['help deliveries', { type: 'help', topic: 'deliveries' }],
    ['help settings', { type: 'help', topic: 'settings' }],
    ['help units', { type: 'help', topic: 'units' }],
    ['how do i add a tank', { type: 'help', topic: 'setup' }],
  ])('%s', (text, expected) => {
    expect(commandOf(text)).toMatchObject(expected);
  });

  it.each([
    ['that was furlongs', /"furlongs" is not a unit/],
    ['that was gpm', /flow unit/],
    ['delete the 25:30 reading', /not a time of day/],
    ['delete the 7:30 reading of T5', /Did you mean T4\?/],
    ['help astrology', /no help on "astrology"/],
    ['undoo', /Did you mean `undo`\?/],
    ['T4 60in\nT9 40%', /one command per message/],
    ['', /empty/],
    ['   \n  ', /empty/],
    ['good morning everyone', /did not understand/],
  ])('%s is refused: %s', (text, message) => {
    expect(errorOf(text)).toMatch(message);
  });
});
