import { describe, expect, it } from 'vitest';
import type { Command, ParseContext } from './command.js';
import { commandOf } from './exampleContext.js';

/**
 * The conversation of the bot's issue, verbatim, read in order the way the bot reads it: the team's tank
 * names grow as tanks are added, and the strapping rows come while the bot awaits them. Times without a zone
 * are in the team's zone (America/Chicago; CST = UTC-6 after 2026-11-01, US rule from memory, as kept in the
 * IANA tz database).
 */
describe('the conversation of the issue', () => {
  it('parses every message, in order, to the command the bot needs', () => {
    const context: ParseContext = {
      now: Date.parse('2026-11-09T15:00:00Z'),
      timeZone: 'America/Chicago',
      tankNames: [],
    };
    const say = (text: string): Command => commandOf(text, context);

    expect(say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal')).toEqual({
      type: 'add-tank',
      tank: 'T4',
      spec: { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 },
      awaitingRows: false,
      raw: 'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
    });
    context.tankNames.push('T4');

    expect(say('add tank T9 strapping unit=L')).toMatchObject({
      type: 'add-tank',
      tank: 'T9',
      spec: { shape: 'strapping', units: { volume: 'L' } },
      awaitingRows: true,
    });
    context.tankNames.push('T9');
    context.awaiting = 'strapping-rows';
    expect(say('0,0\n50,410\n100,830\n150,1240\ndone')).toEqual({
      type: 'strapping-rows',
      rows: [
        [0, 0],
        [50, 410],
        [100, 830],
        [150, 1240],
      ],
      done: true,
    });
    context.awaiting = undefined;

    const level = (value: number, raw: string) => ({ kind: 'level', length: { value, unit: 'in', raw } });
    expect(say('T4 60in at 2026-11-02 07:30')).toEqual({
      type: 'reading',
      tank: 'T4',
      measurement: level(60, '60in'),
      time: { at: Date.parse('2026-11-02T13:30:00Z'), raw: 'at 2026-11-02 07:30' },
      raw: 'T4 60in at 2026-11-02 07:30',
    });
    expect(say('T4 52.3in at 2026-11-05 08:10')).toMatchObject({
      type: 'reading',
      measurement: level(52.3, '52.3in'),
      time: { at: Date.parse('2026-11-05T14:10:00Z') },
    });
    expect(say('delivered 150 gal to T4 at 2026-11-06 10:00')).toEqual({
      type: 'delivery',
      tank: 'T4',
      volume: { value: 150, unit: 'gal', raw: '150 gal' },
      time: { at: Date.parse('2026-11-06T16:00:00Z'), raw: 'at 2026-11-06 10:00' },
      raw: 'delivered 150 gal to T4 at 2026-11-06 10:00',
    });
    expect(say('T4 61.2in at 2026-11-09 07:45')).toMatchObject({
      type: 'reading',
      measurement: level(61.2, '61.2in'),
      time: { at: Date.parse('2026-11-09T13:45:00Z') },
    });
    expect(say('T4?')).toEqual({ type: 'tank-question', tank: 'T4' });
    expect(say('undo')).toEqual({ type: 'undo' });
    expect(say('all')).toEqual({ type: 'overview' });
  });
});
