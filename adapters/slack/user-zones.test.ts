import { describe, expect, it } from 'vitest';
import { createUserZones, failedLookupTtlMs, zoneTtlMs } from './user-zones.js';

describe('createUserZones', () => {
  it('looks a person up once, shares concurrent lookups and refreshes after the TTL', async () => {
    let now = 0;
    const asked: string[] = [];
    const zones = createUserZones(
      async (team, user) => {
        asked.push(`${team}:${user}`);
        return 'America/Chicago';
      },
      () => now,
    );
    const [a, b] = await Promise.all([zones.zoneOf('T1', 'U1'), zones.zoneOf('T1', 'U1')]);
    expect([a, b]).toEqual(['America/Chicago', 'America/Chicago']);
    expect(await zones.zoneOf('T2', 'U1')).toBe('America/Chicago'); // another team, another person
    expect(asked).toEqual(['T1:U1', 'T2:U1']);
    now = zoneTtlMs + 1;
    await zones.zoneOf('T1', 'U1');
    expect(asked).toHaveLength(3);
  });

  it('answers no zone when the lookup fails, and retries only after a short wait', async () => {
    let now = 0;
    let calls = 0;
    const zones = createUserZones(
      async () => {
        calls += 1;
        throw new Error('missing_scope');
      },
      () => now,
    );
    expect(await zones.zoneOf('T1', 'U1')).toBeUndefined();
    expect(await zones.zoneOf('T1', 'U1')).toBeUndefined();
    expect(calls).toBe(1);
    now = failedLookupTtlMs + 1;
    await zones.zoneOf('T1', 'U1');
    expect(calls).toBe(2);
  });
});
