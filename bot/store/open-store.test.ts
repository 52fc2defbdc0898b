import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { openStore, type Store } from './index.js';
import { SINCE_CACHE_SQL } from './team-reads.js';

const T0 = Date.UTC(2026, 10, 2, 7, 30);
const spec = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

let dir: string;
let store: Store;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-store-'));
  store = openStore(join(dir, 'bot.sqlite'));
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

function seedTank(team = 'console:a', code = 'T4') {
  store.teams.ensure(team, T0);
  return store.tanks.add(team, { code, spec, product: 'diesel' }, 'u1', T0);
}

describe('openStore', () => {
  it('uses WAL and foreign keys, and reopening applies no migration twice', () => {
    expect(store.db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(store.db.pragma('foreign_keys', { simple: true })).toBe(1);
    const version = store.db.pragma('user_version', { simple: true });
    seedTank();
    store.close();
    store = openStore(join(dir, 'bot.sqlite'));
    expect(store.db.pragma('user_version', { simple: true })).toBe(version);
    expect(store.tanks.byCode('console:a', 't4')?.spec).toEqual(spec);
  });

  it('reads through a memory map, and walks to the readings after each rate cache from its index', () => {
    expect(store.db.pragma('mmap_size', { simple: true })).toBe(2 ** 30);
    const plan = store.db.prepare(`EXPLAIN QUERY PLAN ${SINCE_CACHE_SQL}`).all('console:a') as {
      detail: string;
    }[];
    expect(plan[0]?.detail).toMatch(/COVERING INDEX rate_cache_as_of/);
  });

  it('makes the first user of a team its admin and later ones members, per team', () => {
    store.teams.ensure('console:a', T0);
    store.teams.ensure('console:b', T0);
    expect(store.teams.ensureMember('console:a', 'ann', 'Ann', T0).role).toBe('admin');
    expect(store.teams.ensureMember('console:a', 'bob', 'Bob', T0).role).toBe('member');
    expect(store.teams.ensureMember('console:a', 'ann', null, T0 + 1).role).toBe('admin');
    expect(store.teams.ensureMember('console:b', 'bob', 'Bob', T0).role).toBe('admin');
  });

  it('keeps teams apart: no lookup, list or write crosses teams', () => {
    const tank = seedTank('console:a');
    store.teams.ensure('console:b', T0);
    expect(store.tanks.byCode('console:b', 'T4')).toBeUndefined();
    expect(store.tanks.byId('console:b', tank.id)).toBeUndefined();
    expect(store.tanks.list('console:b')).toEqual([]);
    // A row of team b that names team a's tank is refused by the composite foreign key.
    expect(() =>
      store.readings.add(
        'console:b',
        { tankId: tank.id, time: T0, kind: 'level', value: 60, unit: 'in', rawText: 'T4 60in', userId: 'x' },
        T0,
      ),
    ).toThrow(/FOREIGN KEY/);
    const r = store.readings.add(
      'console:a',
      { tankId: tank.id, time: T0, kind: 'level', value: 60, unit: 'in', rawText: 'T4 60in', userId: 'u1' },
      T0,
    );
    expect(store.readings.byId('console:b', r.id)).toBeUndefined();
    expect(store.readings.softDelete('console:b', r.id, T0)).toBe(false);
    expect(store.readings.forTank('console:a', tank.id)).toHaveLength(1);
  });

  it('keeps raw input as typed and orders readings by time', () => {
    const tank = seedTank();
    const add = (time: number, value: number, unit: string, rawText: string) =>
      store.readings.add(
        'console:a',
        { tankId: tank.id, time, kind: 'level', value, unit, rawText, userId: 'u1' },
        T0,
      );
    add(T0 + 2, 150, 'cm', 'T4 150cm');
    add(T0, 5.25, 'ft', 'T4 5\' 3"');
    const rows = store.readings.forTank('console:a', tank.id);
    expect(rows.map((r) => [r.value, r.unit, r.rawText])).toEqual([
      [5.25, 'ft', 'T4 5\' 3"'],
      [150, 'cm', 'T4 150cm'],
    ]);
    expect(store.readings.latest('console:a', tank.id)?.unit).toBe('cm');
    expect(store.readings.latest('console:a', tank.id, T0 + 1)?.unit).toBe('ft');
  });

  it('leaves held (suspect) readings out until confirmed, and soft deletes keep the row', () => {
    const tank = seedTank();
    const held = store.readings.add(
      'console:a',
      {
        tankId: tank.id,
        time: T0,
        kind: 'level',
        value: 600,
        unit: 'in',
        rawText: 'T4 600in',
        userId: 'u1',
        status: 'held',
      },
      T0,
    );
    expect(store.readings.forTank('console:a', tank.id)).toEqual([]);
    expect(store.readings.forTank('console:a', tank.id, { includeHeld: true })).toHaveLength(1);
    expect(store.readings.setStatus('console:a', held.id, 'ok')).toBe(true);
    expect(store.readings.forTank('console:a', tank.id)).toHaveLength(1);
    expect(store.readings.softDelete('console:a', held.id, T0 + 1)).toBe(true);
    expect(store.readings.forTank('console:a', tank.id)).toEqual([]);
    const count = store.db.prepare('SELECT COUNT(*) AS n FROM readings').get() as { n: number };
    expect(count.n).toBe(1);
    expect(store.readings.restore('console:a', held.id)).toBe(true);
    expect(store.readings.forTank('console:a', tank.id)).toHaveLength(1);
  });

  it('finds the sender’s last undoable action only, and never the same one twice', () => {
    const tank = seedTank();
    const d = store.deliveries.add(
      'console:a',
      {
        tankId: tank.id,
        time: T0,
        volume: 150,
        unit: 'gal',
        rawText: 'delivered 150 gal to T4',
        userId: 'u1',
      },
      T0,
    );
    const entry = store.audit.record(
      'console:a',
      { userId: 'u1', action: 'delivery.add', target: 'deliveries', targetId: d.id },
      T0,
    );
    store.audit.record('console:a', { userId: 'u1', action: 'settings.update', target: 'teams' }, T0 + 1);
    expect(store.audit.lastUndoable('console:a', 'u2')).toBeUndefined();
    expect(store.audit.lastUndoable('console:b', 'u1')).toBeUndefined();
    expect(store.audit.lastUndoable('console:a', 'u1')?.id).toBe(entry.id);
    expect(store.audit.markUndone('console:a', entry.id, T0 + 2)).toBe(true);
    expect(store.audit.markUndone('console:a', entry.id, T0 + 3)).toBe(false);
    expect(store.audit.lastUndoable('console:a', 'u1')).toBeUndefined();
  });

  it('rolls a whole transaction back when any part throws', () => {
    const tank = seedTank();
    expect(() =>
      store.transaction(() => {
        store.readings.add(
          'console:a',
          { tankId: tank.id, time: T0, kind: 'level', value: 1, unit: 'in', rawText: 'T4 1in', userId: 'u1' },
          T0,
        );
        throw new Error('validation failed late');
      }),
    ).toThrow('validation failed late');
    expect(store.readings.forTank('console:a', tank.id)).toEqual([]);
  });

  it('refuses a second live tank with the same code in a team, case-insensitively', () => {
    seedTank('console:a', 'T4');
    expect(() => store.tanks.add('console:a', { code: 't4', spec }, 'u1', T0)).toThrow(/UNIQUE/);
    const old = store.tanks.byCode('console:a', 'T4')!;
    expect(store.tanks.remove('console:a', old.id, T0 + 1)).toBe(true);
    expect(store.tanks.add('console:a', { code: 't4', spec }, 'u1', T0 + 2).code).toBe('t4');
  });

  it('remembers a processed request per team with its replies', () => {
    store.teams.ensure('console:a', T0);
    const replies = [
      { kind: 'confirmation' as const, visibility: 'channel' as const, headline: 'T4 logged' },
    ];
    expect(store.processedRequests.find('console:a', 'Ev1')).toBeUndefined();
    expect(store.processedRequests.record('console:a', 'Ev1', replies, T0)).toBe(true);
    expect(store.processedRequests.record('console:a', 'Ev1', [], T0)).toBe(false);
    expect(store.processedRequests.find('console:a', 'Ev1')).toEqual(replies);
    expect(store.processedRequests.find('console:b', 'Ev1')).toBeUndefined();
    expect(store.processedRequests.prune('console:b', T0 + 1)).toBe(0);
    expect(store.processedRequests.prune('console:a', T0 + 1)).toBe(1);
  });

  it('keeps one pending exchange per sender and channel', () => {
    store.teams.ensure('console:a', T0);
    const base = { teamId: 'console:a', channel: 'c', userId: 'u1', createdAt: T0 };
    store.pending.put({ ...base, kind: 'setup', state: { step: 1 } });
    store.pending.put({ ...base, kind: 'suspect', state: { readingId: 3 } });
    expect(store.pending.get('console:a', 'c', 'u1')).toMatchObject({
      kind: 'suspect',
      state: { readingId: 3 },
    });
    expect(store.pending.get('console:a', 'c', 'u2')).toBeUndefined();
    expect(store.pending.clear('console:a', 'c', 'u1')).toBe(true);
    expect(store.pending.get('console:a', 'c', 'u1')).toBeUndefined();
  });

  it('updates team settings and survives a hand-damaged JSON column', () => {
    store.teams.ensure('console:a', T0);
    expect(store.teams.get('console:a')?.timeZone).toBe('UTC');
    store.teams.update('console:a', {
      timeZone: 'America/Chicago',
      digestTime: '07:00',
      digestDays: [1, 3, 5],
    });
    expect(store.teams.get('console:a')).toMatchObject({
      timeZone: 'America/Chicago',
      digestDays: [1, 3, 5],
    });
    store.db.prepare("UPDATE teams SET digest_days = '{not json' WHERE id = 'console:a'").run();
    expect(store.teams.get('console:a')?.digestDays).toEqual([]);
  });
});
