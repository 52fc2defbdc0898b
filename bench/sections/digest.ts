// Building the morning digests of a large store: N teams x 50 tanks, 30 days of daily readings each
// (invented demo data), every team's digest built as the scheduler builds it (digestFromStore: the team's
// tank statuses in one store transaction, then the digest composed and fitted; cold: the first look at
// every tank and the first compose of the process; warm: the next morning). Baselines in the same run: the
// raw store scan alone (every team's tanks, readings and deliveries read from SQLite, nothing computed), per
// tank (two queries a tank, the ratio the rows use) and set-based (two queries a team, as digestStatuses now
// reads); the two halves timed apart; and the statuses read per tank (tankStatus asking the store, as before
// the team prefetch) for before/after. Goal from the issue: all digests in under 2 s.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { composeDigest, digestFromStore } from '../../bot/schedule/digest.js';
import { DIGEST_HISTORY_READINGS } from '../../bot/schedule/digest-sections.js';
import { digestStatuses } from '../../bot/schedule/digest-statuses.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { type TankStatus, tankStatus } from '../../bot/tank-status.js';
import type { BenchSection } from '../harness.js';

const DAY = 86_400_000;
const NOW = Date.parse('2026-12-02T13:00:00Z');
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };
const PRODUCTS = ['diesel', 'sodium hypochlorite 12.5%', 'potable water', 'ferric chloride'];

export function seed(store: Store, teams: number, tanksPerTeam: number, days: number): void {
  store.transaction(() => {
    for (let t = 0; t < teams; t++) {
      const team = `bench:${t}`;
      store.teams.ensure(team, NOW - 90 * DAY, {
        name: `Kestrel Valley crew ${t}`,
        timeZone: 'America/Chicago',
      });
      store.teams.update(team, { digestTime: '07:00', digestDays: [], digestChannel: 'ops' });
      for (let k = 0; k < tanksPerTeam; k++) {
        const tank = store.tanks.add(
          team,
          {
            code: `T${k}`,
            site: `Site ${k % 5}`,
            product: PRODUCTS[k % PRODUCTS.length]!,
            spec: drum,
            settings: { threshold: { percent: 20 + (k % 3) * 5 }, leadTimeDays: 2 + (k % 3) },
          },
          'u1',
          NOW - 90 * DAY,
        );
        const use = 4 + ((t * 7 + k * 13) % 17);
        for (let d = 0; d < days; d++) {
          const time = NOW - (days - d) * DAY + (k % 6) * 3_600_000;
          const gal = 520 - use * d + ((d * 31 + k) % 7) - 3;
          store.readings.add(
            team,
            {
              tankId: tank.id,
              time,
              kind: 'volume',
              value: gal,
              unit: 'gal',
              rawText: `${gal} gal`,
              userId: 'u1',
            },
            time,
          );
        }
      }
    }
  });
}

function timeMs(fn: () => number): { ms: number; sink: number } {
  const start = process.hrtime.bigint();
  const sink = fn();
  return { ms: Number(process.hrtime.bigint() - start) / 1e6, sink };
}

export const digestSection: BenchSection = {
  title: 'Scheduler: morning digests, teams x 50 tanks (30 daily readings each)',
  async run() {
    // 1,000 teams, the size, by default (about a minute with seeding 1.5 million readings);
    // BENCH_DIGEST_TEAMS=100 runs a tenth of it.
    const teams = Math.max(1, Number(process.env.BENCH_DIGEST_TEAMS ?? 1000) || 1000);
    const dir = mkdtempSync(join(tmpdir(), 'tr-bench-digest-'));
    const store = openStore(join(dir, 'bench.sqlite'));
    try {
      seed(store, teams, 50, 30);
      const all = store.teams.list();
      const scan = timeMs(() => {
        let rows = 0;
        for (const team of all) {
          for (const tank of store.tanks.list(team.id)) {
            rows +=
              store.readings.forTank(team.id, tank.id).length +
              store.deliveries.forTank(team.id, tank.id).length;
          }
        }
        return rows;
      });
      const teamReadings = store.db.prepare<[string], unknown>(
        'SELECT * FROM readings WHERE team_id = ? AND deleted_at IS NULL ORDER BY tank_id, time, id',
      );
      const teamDeliveries = store.db.prepare<[string], unknown>(
        'SELECT * FROM deliveries WHERE team_id = ? AND deleted_at IS NULL ORDER BY tank_id, time, id',
      );
      const setScan = timeMs(() => {
        let rows = 0;
        for (const team of all) {
          rows +=
            store.tanks.list(team.id).length +
            teamReadings.all(team.id).length +
            teamDeliveries.all(team.id).length;
        }
        return rows;
      });
      // As the scheduler builds them: digestFromStore per team (its statuses in one transaction, then composed
      // and fitted), each digest dropped before the next. Cold: the first look at every tank (the stored rate
      // state is built) and the first compose of the process. Warm: the next morning's case, when the bot has
      // kept each tank's rate state as readings came in.
      const buildAll = (now: number) =>
        timeMs(() => {
          let chars = 0;
          for (const team of all) chars += digestFromStore(store, team, now, now - DAY).headline.length;
          return chars;
        });
      const cold = buildAll(NOW);
      const warm = buildAll(NOW + 60_000);
      // The two halves timed apart (every team's statuses kept, then every digest composed): more live memory
      // than the scheduler holds, so they add up to more than the warm row.
      const statuses = new Map<string, TankStatus[]>();
      const statusHalf = timeMs(() => {
        let n = 0;
        for (const team of all) {
          const list = digestStatuses(store, team.id, NOW + 120_000);
          statuses.set(team.id, list);
          n += list.length;
        }
        return n;
      });
      const composeHalf = timeMs(() => {
        let chars = 0;
        for (const team of all) {
          const reply = composeDigest({
            teamName: team.name,
            timeZone: team.timeZone,
            demo: false,
            now: NOW,
            since: NOW - DAY,
            statuses: statuses.get(team.id) ?? [],
          });
          chars += reply.headline.length;
        }
        return chars;
      });
      statuses.clear();
      // Before the team prefetch: the same transaction per team, every read a query per tank.
      const perTank = timeMs(() => {
        let n = 0;
        for (const team of all) {
          store.db.transaction(() => {
            const known = { timeZone: team.timeZone };
            for (const tank of store.tanks.list(team.id)) {
              const options = { historyLimit: DIGEST_HISTORY_READINGS, known: { ...known, tank } };
              if (tankStatus(store, team.id, tank.id, NOW + 180_000, options)) n++;
            }
          })();
        }
        return n;
      });
      const scale = `${teams.toLocaleString('en-US')} teams x 50 tanks`;
      const vsScan = { name: 'raw store scan alone', value: scan.ms };
      return [
        {
          name: `cold: all digests built as the scheduler does, ${scale} (first status of every tank, first compose)`,
          value: cold.ms,
          unit: 'ms',
          baseline: vsScan,
          goal: '< 2,000 ms for 1,000 teams',
        },
        {
          name: `warm: all digests built as the scheduler does, ${scale} (rate state kept)`,
          value: warm.ms,
          unit: 'ms',
          baseline: vsScan,
          goal: '< 2,000 ms for 1,000 teams',
        },
        {
          name: "  tank statuses alone, warm, every team's kept",
          value: statusHalf.ms,
          unit: 'ms',
          baseline: vsScan,
        },
        {
          name: '  compose + fit alone (bot/schedule), warm',
          value: composeHalf.ms,
          unit: 'ms',
          baseline: vsScan,
        },
        {
          name: '  tank statuses, warm, read per tank (before the team prefetch)',
          value: perTank.ms,
          unit: 'ms',
          baseline: vsScan,
        },
        {
          name: 'raw store scan, set-based (two queries a team)',
          value: setScan.ms,
          unit: 'ms',
          baseline: vsScan,
        },
        {
          name: '  tank statuses alone, warm, against the set-based scan',
          value: statusHalf.ms,
          unit: 'ms',
          baseline: { name: 'raw store scan, set-based', value: setScan.ms },
        },
        { name: 'per digest (50 tanks), warm', value: warm.ms / teams, unit: 'ms' },
      ];
    } finally {
      store.close();
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
