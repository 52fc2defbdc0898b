import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type TempStore, tempStore } from '../../test/schedule/helpers.js';
import { gaugeFirstNote } from '../replies/cautions.js';
import { toPlainText } from '../replies/plainText.js';
import type { Store } from '../store/index.js';
import { tankStatus } from '../tank-status.js';
import { composeDigest, DIGEST_MAX_CHARS, digestFromStore, previewDigest } from './digest.js';
import { createScheduler } from './scheduler.js';

// Demo scenario of our own invention: Kestrel Valley Water Co-op (DEMO DATA).
const DAY = 86_400_000;
const HOUR = 3_600_000;
const NOW = Date.parse('2026-12-02T13:00:00Z'); // 07:00 in America/Chicago
const TEAM = 'console:kestrel';
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
  store.teams.ensure(TEAM, NOW - 60 * DAY, {
    name: 'Kestrel Valley Water Co-op',
    timeZone: 'America/Chicago',
  });
});
afterEach(() => temp.cleanup());

function addTank(code: string, site: string, product: string, settings = {}) {
  return store.tanks.add(TEAM, { code, site, product, spec: drum, settings }, 'u1', NOW - 60 * DAY).id;
}

/** Volume readings (gal) at the given times; the bot keeps them raw, as typed. */
function read(tankId: number, points: [number, number][]) {
  store.transaction(() => readAll(tankId, points));
}
function readAll(tankId: number, points: [number, number][]) {
  for (const [time, gal] of points) {
    store.readings.add(
      TEAM,
      { tankId, time, kind: 'volume', value: gal, unit: 'gal', rawText: `${gal} gal`, userId: 'u1' },
      time,
    );
  }
}

/** Daily readings at 08:00 local (14:00Z), `days` of them ending `endDaysAgo` days before NOW. */
function daily(tankId: number, start: number, perDay: number, days: number, endDaysAgo = 1) {
  const first = NOW - (endDaysAgo + days - 1) * DAY + HOUR;
  read(
    tankId,
    Array.from({ length: days }, (_, i) => [first + i * DAY, start - perDay * i] as [number, number]),
  );
}

describe('composeDigest from the store', () => {
  it('lists orders per site, overdue tanks, news since the last digest, and the runway table, with cautions', () => {
    const gen1 = addTank('GEN1', 'Ridge Pump Station', 'diesel', {
      threshold: { percent: 30 },
      leadTimeDays: 3,
    });
    const gen2 = addTank('GEN2', 'Ridge Pump Station', 'diesel', {
      threshold: { percent: 30 },
      leadTimeDays: 3,
    });
    const hypo = addTank('HYPO', 'Mill Creek Lift Station', 'sodium hypochlorite 12.5%');
    const w1 = addTank('W1', 'North Yard', 'potable water');
    daily(gen1, 330, 12, 14);
    daily(gen2, 320, 11, 14);
    daily(hypo, 500, 2, 14, 4); // last read four days ago, usually daily
    daily(w1, 350, 3, 14);
    store.deliveries.add(
      TEAM,
      {
        tankId: w1,
        time: NOW - 10 * HOUR,
        volume: 100,
        unit: 'gal',
        rawText: 'delivered 100 gal to W1',
        userId: 'u1',
      },
      NOW - 10 * HOUR,
    );
    read(w1, [[NOW - 9 * HOUR, 411]]);
    const d1 = addTank('D1', 'North Yard', 'potable water');
    daily(d1, 480, 3, 14);
    read(d1, [
      [NOW - 6 * HOUR, 480 - 3 * 14 - 90],
      [NOW - 3 * HOUR, 480 - 3 * 14 - 90.4],
      [NOW - 1 * HOUR, 480 - 3 * 14 - 90.6],
    ]);

    const team = store.teams.get(TEAM)!;
    const reply = digestFromStore(store, team, NOW, NOW - DAY);
    const facts = Object.fromEntries((reply.facts ?? []).map((f) => [f.label, f.value]));
    expect(reply.kind).toBe('digest');
    expect(reply.visibility).toBe('channel');
    expect(reply.headline).toMatch(
      /^Morning digest for Kestrel Valley Water Co-op, Wed 2 Dec: \d+ things need attention\.$/,
    );
    // The order, then once the note the answers give beside a quantity: gauge the tank before filling.
    expect(facts['Order today']).toMatch(
      /^Ridge Pump Station, diesel: [\d,]+ gal \(GEN\d [\d,]+ gal, GEN\d [\d,]+ gal\) \(gauge the tank before filling, /,
    );
    expect(facts['Order today']!.endsWith(`(${gaugeFirstNote('order')})`)).toBe(true);
    // The quantities are the refill planner's, through tankStatus (computed in one place).
    const plan1 = tankStatus(store, TEAM, gen1, NOW)!.refill!;
    expect(plan1.verdict).toBe('order-now');
    expect(facts['Order today']).toContain(`GEN1 ${Math.round(plan1.quantity!).toLocaleString('en-US')} gal`);
    expect(facts['Overdue readings']).toMatch(/^HYPO: last read \d+ days ago \(usually every 24 hours\)$/);
    // The rise the rate engine measured around the logged delivery, as tankStatus reports it.
    const rise = tankStatus(store, TEAM, w1, NOW)!.events.find((e) => e.type === 'delivery')!;
    expect(rise.logged).toBe(true);
    expect(facts['Deliveries since the last digest']).toBe(
      `W1 +${Math.round(rise.volume)} gal, yesterday, Tue 1 Dec`,
    );
    // An unlogged overnight loss of 90 gal from a tank that uses 3 gal/day.
    const drop = tankStatus(store, TEAM, d1, NOW)!.events.find((e) => e.type === 'withdrawal')!;
    expect(drop.logged).toBe(false);
    expect(facts['Unexplained drops']).toBe(
      `D1 -${drop.volume.toFixed(1)} gal, yesterday, Tue 1 Dec (possible leak or theft: check the tank, log any use)`,
    );
    // Rows sorted by runway: the two diesel tanks come first.
    const rows = reply.table!.rows;
    expect(
      rows
        .slice(0, 2)
        .map((r) => r[0])
        .sort(),
    ).toEqual(['GEN1', 'GEN2']);
    const runways = rows
      .map((r) => r[0]!)
      .map((code) => {
        const id = store.tanks.byCode(TEAM, code)!.id;
        return tankStatus(store, TEAM, id, NOW)!.runway?.days ?? Number.POSITIVE_INFINITY;
      });
    expect(runways).toEqual([...runways].sort((a, b) => a - b));
    expect(rows[0]![4]).toBe('order today');
    // Diesel to order today: the fuel caution, deferring to local codes.
    expect(reply.caution).toMatch(/flammable/);
    expect(reply.caution).toMatch(/local codes/);
    expect(toPlainText(reply).length).toBeLessThanOrEqual(DIGEST_MAX_CHARS);
  });

  it('says all clear in one line when nothing needs attention', () => {
    const w1 = addTank('W1', 'North Yard', 'potable water');
    daily(w1, 500, 2, 10, 0);
    const reply = digestFromStore(store, store.teams.get(TEAM)!, NOW, NOW - DAY);
    expect(reply.headline).toBe(
      'All clear for Kestrel Valley Water Co-op, Wed 2 Dec: nothing to order today, no overdue readings, no unexplained drops (1 tank).',
    );
    expect(reply.facts).toBeUndefined();
    expect(reply.caution).toBeUndefined();
  });

  it('lists a tank with no readings, and a tank whose stored shape is broken, without crashing', () => {
    addTank('NEW1', 'North Yard', 'potable water');
    store.tanks.add(TEAM, { code: 'BAD1', spec: { shape: 'blob' } }, 'u1', NOW);
    const reply = digestFromStore(store, store.teams.get(TEAM)!, NOW, null);
    const text = toPlainText(reply);
    expect(text).toContain('NEW1: no readings yet');
    expect(text).toMatch(/BAD1's stored shape is not valid/);
  });
});

describe('previewDigest (`digest now`)', () => {
  it('reports news since the last digest delivered to the channel, not the same delivery twice', async () => {
    store.teams.update(TEAM, { digestTime: '07:00', digestDays: [], digestChannel: 'ops' });
    const w1 = addTank('W1', 'North Yard', 'potable water');
    const firstRead = Date.parse('2026-11-17T14:00:00Z');
    read(
      w1,
      Array.from({ length: 14 }, (_, i) => [firstRead + i * DAY, 350 - 3 * i] as [number, number]),
    );
    const delivered = Date.parse('2026-12-01T02:00:00Z'); // Mon 30 Nov 20:00 in Chicago
    store.deliveries.add(
      TEAM,
      {
        tankId: w1,
        time: delivered,
        volume: 100,
        unit: 'gal',
        rawText: 'delivered 100 gal to W1',
        userId: 'u1',
      },
      delivered,
    );
    read(w1, [[delivered + HOUR, 408]]);
    const preview = Date.parse('2026-12-02T00:00:00Z'); // Tue 1 Dec 18:00 in Chicago
    const fact = (label: string) =>
      previewDigest(store, store.teams.get(TEAM)!, preview).facts?.find((f) => f.label === label)?.value;

    // No digest yet: the last day's news, the delivery included.
    expect(fact('Deliveries since the last digest')).toMatch(/^W1 \+[\d.]+ gal, yesterday, Mon 30 Nov/);
    // Tuesday's 07:00 digest goes out (and reports it) ...
    const posted: string[] = [];
    const scheduler = createScheduler({
      store,
      clock: () => preview,
      graceMinutes: 60,
      claimNotices: false,
      deliver: (_t, _c, replies) => {
        posted.push(toPlainText(replies[0]!));
      },
    });
    await scheduler.tick(Date.parse('2026-12-01T13:00:00Z'));
    expect(posted).toHaveLength(1);
    expect(posted[0]).toContain('W1 +');
    // ... so a preview that evening has no delivery news left.
    expect(fact('Deliveries since the last digest')).toBeUndefined();
  });
});

describe('the digest fits one message on every platform', () => {
  it('cuts long lists with "and N more" and stays under the strictest limit', () => {
    const statuses = [];
    for (let i = 0; i < 120; i++) {
      const id = addTank(`T${i}`, `Site ${i % 7}`, i % 2 ? 'diesel' : 'sodium hypochlorite', {
        threshold: { percent: 40 },
        leadTimeDays: 5,
      });
      read(id, [
        [NOW - 5 * DAY, 300],
        [NOW - 4 * DAY, 280],
        [NOW - 3 * DAY, 260],
      ]);
      statuses.push(tankStatus(store, TEAM, id, NOW)!);
    }
    const reply = composeDigest({
      teamName: 'Kestrel Valley Water Co-op',
      timeZone: 'America/Chicago',
      demo: true,
      now: NOW,
      since: NOW - DAY,
      statuses,
    });
    const text = toPlainText(reply);
    expect(text.length).toBeLessThanOrEqual(DIGEST_MAX_CHARS); // Discord content: 2,000 (chat-platforms.md)
    expect(text).toMatch(/and \d+ more/);
    expect(reply.headline).toContain('(DEMO DATA)');
    expect((reply.facts ?? []).length).toBeLessThanOrEqual(25); // Discord embed fields
    for (const fact of reply.facts ?? []) expect(fact.value.length).toBeLessThanOrEqual(1024); // per field
    expect(reply.table!.rows.length).toBeGreaterThan(0);
    // The rows left out are counted, not lost: shown + "and N more" = all tanks.
    const last = reply.table!.rows.at(-1)![0]!;
    const more = Number(/^and (\d+) more$/.exec(last)?.[1]);
    expect(reply.table!.rows.length - 1 + more).toBe(120);
  });
});
