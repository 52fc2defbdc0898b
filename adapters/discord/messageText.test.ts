import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { messageFor, setupMessage } from './messageText.js';

const text = (sub: string, options: Record<string, string>) => {
  const r = messageFor(sub, options);
  if (!r.ok) throw new Error(r.error);
  return r.value;
};

describe('messageFor', () => {
  it('turns each subcommand into a message of the bot language', () => {
    expect(text('log', { tank: 'T4', reading: '52.3in', when: '7:30' })).toBe('T4 52.3in at 7:30');
    expect(text('log', { tank: 'T4', reading: '48%', when: 'yesterday 4pm' })).toBe('T4 48% yesterday 4pm');
    expect(text('log', { tank: 'T4', reading: 'ullage 14in' })).toBe('T4 ullage 14in');
    expect(
      text('delivery', { tank: 'T4', amount: '400 gal', ticket: '8812', when: '10:00', level_after: '61in' }),
    ).toBe('delivered 400 gal to T4 ticket 8812 at 10:00 level 61in');
    expect(text('ask', { tank: 'T4' })).toBe('T4?');
    expect(text('list', {})).toBe('all');
    expect(text('list', { running_low: 'this week' })).toBe('which tanks run low this week?');
    expect(text('settings', { tank: 'T4', setting: 'threshold 20%' })).toBe('set T4 threshold 20%');
    expect(text('settings', { setting: 'set digest 07:00 weekdays here' })).toBe(
      'set digest 07:00 weekdays here',
    );
    expect(text('timezone', { zone: 'America/Chicago' })).toBe('set time zone America/Chicago');
    expect(text('help', { topic: 'units' })).toBe('help units');
    expect(text('help', {})).toBe('help');
    expect(text('say', { message: 'undo' })).toBe('undo');
  });

  it('keeps a pasted table in say, and folds newlines in one-line options', () => {
    expect(text('say', { message: 'add tank T9 strapping unit=L\n0,0\n100,950\ndone' })).toContain('\n0,0\n');
    expect(text('log', { tank: 'T4\n', reading: '52.3\nin' })).toBe('T4 52.3 in');
  });

  it('says what is missing instead of sending an empty message', () => {
    expect(messageFor('log', { tank: 'T4' })).toEqual({
      ok: false,
      error: 'Give the reading, e.g. 52.3in or 48%.',
    });
    expect(messageFor('say', { message: '  ' }).ok).toBe(false);
    expect(messageFor('list', { running_low: 'someday' }).ok).toBe(false);
    expect(messageFor('explode', {}).ok).toBe(false);
    expect(messageFor('setup', {}).ok).toBe(false);
  });

  it('never throws on any options (property)', () => {
    fc.assert(
      fc.property(fc.string(), fc.dictionary(fc.string(), fc.string()), (sub, options) => {
        const r = messageFor(sub, options);
        if (!r.ok) expect(r.error.length).toBeGreaterThan(0);
      }),
    );
  });
});

describe('setupMessage', () => {
  it('makes one add-tank line, quoting free text', () => {
    const r = setupMessage({
      code: 'T4',
      shape: 'vertical-cylinder diameter=48in length=72in',
      unit: 'gal',
      product: 'diesel',
      site: 'Ridge "Pump" Station',
    });
    expect(r).toEqual({
      ok: true,
      value: `add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product="diesel" site="Ridge 'Pump' Station"`,
    });
  });

  it('puts strapping table lines on their own lines', () => {
    const r = setupMessage({ code: 'T9', shape: 'strapping\n0,0\n\n100, 950\ndone', unit: 'L' });
    expect(r).toEqual({ ok: true, value: 'add tank T9 strapping unit=L\n0,0\n100, 950\ndone' });
  });

  it('names a missing field', () => {
    expect(setupMessage({ code: '', shape: 'sphere diameter=2m', unit: 'L' })).toMatchObject({ ok: false });
    expect(setupMessage({ code: 'T1', shape: ' ', unit: 'L' })).toMatchObject({ ok: false });
    expect(setupMessage({ code: 'T1', shape: 'sphere diameter=2m', unit: '' })).toMatchObject({ ok: false });
  });
});
