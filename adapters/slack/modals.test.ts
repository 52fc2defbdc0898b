import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  modalErrors,
  originOf,
  settingsMessages,
  settingsModal,
  setupMessage,
  setupModal,
  type ViewValues,
} from './modals.js';

const typed = (fields: Record<string, string>): ViewValues =>
  Object.fromEntries(Object.entries(fields).map(([k, v]) => [k, { value: { value: v } }]));
const chosen = (fields: Record<string, string>): ViewValues =>
  Object.fromEntries(
    Object.entries(fields).map(([k, v]) => [k, { value: { selected_option: { value: v } } }]),
  );

describe('setup modal', () => {
  it('becomes one add-tank message in the bot language', () => {
    const values = {
      ...typed({
        tank: 'T4',
        diameter: '48 in',
        length: '72in',
        product: 'sodium hypochlorite',
        site: 'Mill Creek Lift Station',
      }),
      ...chosen({ shape: 'vertical-cylinder', unit: 'gal' }),
    };
    expect(setupMessage(values)).toEqual({
      ok: true,
      value:
        'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product="sodium hypochlorite" site="Mill Creek Lift Station"',
    });
  });

  it('keeps a typed quote or newline from adding keys', () => {
    const r = setupMessage(typed({ tank: 'T4', site: 'North Yard" unit=L\nremove tank T4' }));
    expect(r.ok && r.value).toBe(
      'add tank T4 vertical-cylinder unit=gal site="North Yard unit=L remove tank T4"',
    );
  });

  it('asks for a name without spaces, on the name field', () => {
    const r = setupMessage(typed({ tank: 'Day tank' }));
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(modalErrors(r.error, 'tank')).toEqual({
        tank: 'A short name has no spaces, e.g. T4 or HYPO-1.',
      });
    expect(setupMessage({}).ok).toBe(false);
  });

  it('remembers the channel it was opened from, and distrusts a tampered one', () => {
    const view = setupModal({ channel: 'C0RIDGE' });
    expect(originOf(view.private_metadata)).toEqual({ channel: 'C0RIDGE' });
    expect(originOf('{"channel":"<script>"}')).toEqual({});
    expect(originOf('not json')).toEqual({});
    expect(settingsModal({}).blocks.length).toBeGreaterThan(3);
  });
});

describe('settings modal', () => {
  it('becomes set messages, tank settings first', () => {
    const r = settingsMessages(
      typed({ tank: 'T4', threshold: '20%', 'lead-time': '3 business days', 'time-zone': 'America/Chicago' }),
    );
    expect(r).toEqual({
      ok: true,
      value: ['set T4 threshold 20%', 'set T4 lead time 3 business days', 'set time zone America/Chicago'],
    });
  });

  it('needs a tank for tank settings and at least one field', () => {
    expect(settingsMessages(typed({ threshold: '20%' }))).toEqual({
      ok: false,
      error: 'tank: Name the tank the threshold is for.',
    });
    expect(settingsMessages({}).ok).toBe(false);
    expect(settingsMessages(typed({ digest: '07:00 weekdays' }))).toEqual({
      ok: true,
      value: ['set digest 07:00 weekdays here'],
    });
  });
});

describe('modal fields cannot change what the message does', () => {
  // Law: whatever a person types in the free-text fields, the setup form is read by the bot's own parser as
  // one add-tank of the named tank, or refused; never as another command.
  it('the setup message parses as add-tank of that tank or not at all', async () => {
    const { parseMessage } = await import('../../bot/language/index.js');
    const context = { now: Date.UTC(2026, 11, 2, 8), timeZone: 'UTC', tankNames: ['T4'] };
    fc.assert(
      fc.property(
        fc.string({ maxLength: 40 }),
        fc.string({ maxLength: 40 }),
        fc.string({ maxLength: 12 }),
        (product, site, diameter) => {
          const message = setupMessage({
            ...typed({ tank: 'T9', product, site, diameter, length: '72in' }),
            ...chosen({ shape: 'vertical-cylinder', unit: 'gal' }),
          });
          if (!message.ok) return false;
          const parsed = parseMessage(message.value, context);
          return !parsed.ok || (parsed.value.type === 'add-tank' && parsed.value.tank === 'T9');
        },
      ),
      { numRuns: 200 },
    );
  });
});
