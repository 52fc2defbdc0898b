import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createBot } from '../bot.js';
import { openStore, type Store } from '../store/index.js';
import { tankStatus } from '../tank-status.js';
import { seedDemoTeam } from './seed-demo.js';

const NOW = Date.parse('2026-11-09T16:00:00Z');
const TEAM = 'console:local';
const DAY = 86_400_000;

let dir: string;
let store: Store;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-demo-'));
  store = openStore(join(dir, 'demo.sqlite'));
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('seedDemoTeam', () => {
  it('seeds the invented co-op with tanks of different shapes and months of history, once', () => {
    expect(seedDemoTeam(store, TEAM, NOW, 'ann')).toBe(true);
    const team = store.teams.get(TEAM)!;
    expect(team).toMatchObject({ demo: true, timeZone: 'America/Denver' });
    expect(team.name).toContain('DEMO DATA');
    expect(store.teams.getMember(TEAM, 'ann')?.role).toBe('admin');
    const tanks = store.tanks.list(TEAM);
    const shapes = new Set(tanks.map((t) => (t.spec as { shape: string }).shape));
    expect(shapes).toEqual(new Set(['vertical-cylinder', 'horizontal-cylinder', 'rectangular', 'strapping']));
    expect(tanks.find((t) => t.site === 'Mill Creek Lift Station')?.product).toMatch(/hypochlorite/);
    expect(tanks.find((t) => t.site === 'Ridge Pump Station')?.product).toMatch(/diesel/);
    expect(tanks.some((t) => t.settings.filling)).toBe(true);
    for (const tank of tanks) {
      const status = tankStatus(store, TEAM, tank.id, NOW)!;
      expect(status.problem).toBeUndefined();
      expect(status.skipped).toBe(0);
      expect(status.readingCount).toBeGreaterThan(30);
      expect(NOW - status.history[0]!.time).toBeGreaterThan(90 * DAY);
      expect(status.runway?.days).not.toBeNull();
    }
    // Some deliveries were logged, some not: the rate engine finds the others.
    const logged = store.db.prepare('SELECT COUNT(*) AS n FROM deliveries').get() as { n: number };
    expect(logged.n).toBeGreaterThan(0);
    const hypo = tanks.find((t) => t.code === 'HYPO-1')!;
    expect(tankStatus(store, TEAM, hypo.id, NOW)!.events.some((e) => e.type === 'delivery')).toBe(true);
    expect(seedDemoTeam(store, TEAM, NOW, 'ann')).toBe(false);
    expect(store.tanks.list(TEAM)).toHaveLength(tanks.length);
  });

  it('labels its answers as demo data', async () => {
    seedDemoTeam(store, TEAM, NOW, 'ann');
    const bot = createBot({ store });
    const ask = (text: string) =>
      bot.handle({ team: TEAM, channel: 'console', user: 'ann', text, receivedAt: NOW });
    const [all] = await ask('all');
    expect(all?.headline).toContain('DEMO DATA');
    expect(all?.table?.rows).toHaveLength(4);
    const [hypo] = await ask('HYPO-1?');
    expect(hypo?.headline).toContain('DEMO DATA');
    expect(hypo?.chart?.title).toContain('DEMO DATA');
    expect(hypo?.caution).toMatch(/local codes/);
  });
});
