import { describe, expect, it } from 'vitest';
import { commandSchema } from './command.js';

describe('commandSchema', () => {
  it('accepts a level reading with its text as typed', () => {
    const parsed = commandSchema.safeParse({
      type: 'reading',
      tank: 'T4',
      measurement: { kind: 'level', length: { value: 62, unit: 'in', raw: `5' 2"` } },
      raw: `T4 5' 2"`,
    });
    expect(parsed.success).toBe(true);
  });

  it('rejects a negative level and an unknown unit', () => {
    const negative = commandSchema.safeParse({
      type: 'reading',
      tank: 'T4',
      measurement: { kind: 'level', length: { value: -1, unit: 'in', raw: '-1in' } },
      raw: 'T4 -1in',
    });
    const unknownUnit = commandSchema.safeParse({
      type: 'delivery',
      tank: 'T4',
      volume: { value: 5, unit: 'hogshead', raw: '5 hogshead' },
      raw: 'T4 +5 hogshead',
    });
    expect(negative.success).toBe(false);
    expect(unknownUnit.success).toBe(false);
  });

  it('rejects a digest time that is not HH:MM and a threshold above 100%', () => {
    const badTime = commandSchema.safeParse({
      type: 'set',
      setting: { key: 'digest', time: '7am', weekdays: [1], channel: 'here' },
      raw: 'set digest 7am',
    });
    const badPercent = commandSchema.safeParse({
      type: 'set',
      tank: 'T4',
      setting: { key: 'threshold', threshold: { percent: 120 } },
      raw: 'set T4 threshold 120%',
    });
    expect(badTime.success).toBe(false);
    expect(badPercent.success).toBe(false);
  });
});
