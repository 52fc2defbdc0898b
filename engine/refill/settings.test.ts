import { describe, expect, it } from 'vitest';
import { parseRefillSettings } from './settings.js';

function errorOf(raw: unknown): string {
  const r = parseRefillSettings(raw);
  if (r.ok) throw new Error(`expected an error for ${JSON.stringify(raw)}`);
  return r.error;
}

describe('parseRefillSettings', () => {
  it('fills the documented defaults when only the threshold is given', () => {
    const r = parseRefillSettings({ threshold: { percent: 20 } });
    expect(r).toEqual({
      ok: true,
      value: {
        threshold: { percent: 20 },
        leadTimeDays: 0,
        businessDays: false,
        orderCutoffHour: 24,
        deliveryWeekdays: [1, 2, 3, 4, 5, 6, 7],
        deliveryHours: [0, 24],
        minimumOrder: 0,
        orderIncrement: 0,
        safeFillPercent: 90,
        serviceLevel: 0.95,
        timeZone: 'UTC',
      },
    });
  });

  it('accepts the full example of the CLI contract, section 5', () => {
    const r = parseRefillSettings({
      threshold: { percent: 20 },
      leadTimeDays: 3,
      businessDays: true,
      orderCutoffHour: 12,
      deliveryWeekdays: [2, 4],
      minimumOrder: 100,
      orderIncrement: 50,
      safeFillPercent: 90,
      serviceLevel: 0.95,
      timeZone: 'America/Chicago',
    });
    expect(r.ok).toBe(true);
  });

  it('accepts each threshold form', () => {
    for (const threshold of [{ volume: 150 }, { runwayDays: 5 }, { percent: 0 }]) {
      expect(parseRefillSettings({ threshold }).ok).toBe(true);
    }
  });

  it('requires the threshold and says how to write one', () => {
    expect(errorOf({})).toMatch(/"threshold" is missing.*percent/);
    expect(errorOf({ threshold: { percent: 120 } })).toMatch(/threshold/);
    expect(errorOf({ threshold: { litres: 5 } })).toMatch(/threshold/);
  });

  it('takes delivery hours as a [from, to] pair of local hours and explains a wrong one', () => {
    const r = parseRefillSettings({ threshold: { percent: 20 }, deliveryHours: [8, 12] });
    expect(r.ok && r.value.deliveryHours).toEqual([8, 12]);
    expect(errorOf({ threshold: { percent: 20 }, deliveryHours: [12, 8] })).toMatch(
      /deliveryHours.*\[8, 12\]/,
    );
    expect(errorOf({ threshold: { percent: 20 }, deliveryHours: [8] })).toMatch(/deliveryHours/);
    expect(errorOf({ threshold: { percent: 20 }, deliveryHours: [8, 25] })).toMatch(/deliveryHours/);
  });

  it('suggests the nearest key for a misspelt one', () => {
    expect(errorOf({ threshold: { percent: 20 }, leadTimeDay: 3 })).toMatch(/did you mean "leadTimeDays"/);
  });

  it('explains a service level written as a percent', () => {
    expect(errorOf({ threshold: { percent: 20 }, serviceLevel: 95 })).toMatch(/0\.95 \(not 95\)/);
  });

  it('rejects an unknown time zone, weekday 0 and a non-object', () => {
    expect(errorOf({ threshold: { percent: 20 }, timeZone: 'Mars/Olympus' })).toMatch(/IANA/);
    expect(errorOf({ threshold: { percent: 20 }, deliveryWeekdays: [0, 2] })).toMatch(/1 \(Monday\)/);
    expect(errorOf([1, 2])).toMatch(/JSON object/);
    expect(errorOf(null)).toMatch(/JSON object/);
    expect(errorOf({ threshold: { percent: 20 }, minimumOrder: -5 })).toMatch(/minimumOrder/);
  });
});
