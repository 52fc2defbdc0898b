import { existsSync, mkdirSync } from 'node:fs';
import { userInfo } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { runConsoleChat } from '../../adapters/console/console-chat.js';
import { consoleSchedule } from '../../adapters/console/console-schedule.js';
import { createBot } from '../../bot/bot.js';
import { isValidTimeZone } from '../../bot/commands/time-zone.js';
import { seedDemoTeam } from '../../bot/demo/seed-demo.js';
import { openStore } from '../../bot/store/index.js';
import { type CliCommand, UsageError } from '../io.js';

/** The console is one team; the demo seeds the same one so `npm start` opens straight onto it. */
export const CONSOLE_TEAM = 'console:local';

function defaultUser(): string {
  try {
    return userInfo().username || 'operator';
  } catch {
    return 'operator';
  }
}

export const chatCommand: CliCommand = {
  name: 'chat',
  async run(argv, io) {
    const { values } = parseArgs({
      args: argv,
      options: {
        db: { type: 'string' },
        demo: { type: 'boolean', default: false },
        user: { type: 'string' },
        'time-zone': { type: 'string' },
        now: { type: 'string' },
        charts: { type: 'string' },
        help: { type: 'boolean', short: 'h', default: false },
      },
      strict: true,
      allowPositionals: false,
    });
    if (values.help) {
      io.stdout.write(
        'usage: tankrunway chat --db FILE [--demo] [--user NAME] [--time-zone ZONE] [--now ISO] [--charts DIR]\n',
      );
      return 0;
    }
    if (!values.db)
      throw new UsageError('--db FILE is required (the SQLite file of the team; created if missing)');
    const zone = values['time-zone'];
    if (zone !== undefined && !isValidTimeZone(zone)) {
      throw new UsageError(
        `--time-zone "${zone}" is not an IANA zone name such as America/Chicago or Europe/Paris`,
      );
    }
    let start = 0;
    if (values.now !== undefined) {
      start = Date.parse(values.now);
      if (!Number.isFinite(start)) throw new UsageError(`--now "${values.now}" is not an ISO 8601 instant`);
    }
    // With --now the clock stands still (scripts and tests replay exactly); without it, it is the wall clock.
    const clock = values.now !== undefined ? () => start : () => Date.now();
    const dbPath = resolve(values.db);
    if (!existsSync(dirname(dbPath))) mkdirSync(dirname(dbPath), { recursive: true });

    let store: ReturnType<typeof openStore>;
    try {
      store = openStore(dbPath);
    } catch (error) {
      throw new UsageError(
        `cannot open ${values.db}: ${error instanceof Error ? error.message : String(error)}`,
      );
    }
    try {
      const user = values.user ?? defaultUser();
      if (values.demo && store.teams.list().length === 0) {
        seedDemoTeam(store, CONSOLE_TEAM, clock(), user);
        io.stdout.write(
          'Loaded the demo team "Kestrel Valley Water Co-op" (DEMO DATA, invented). Send `all` or `help`.\n\n',
        );
      }
      const bot = createBot({ store, ...(zone ? { defaultTimeZone: zone } : {}) });
      const interactive = Boolean((io.stdin as { isTTY?: boolean }).isTTY);
      const schedule = consoleSchedule({
        store,
        output: io.stdout,
        clock,
        log: (line) => io.stderr.write(`${line}\n`),
        intervalMs: interactive ? 30_000 : 0,
      });
      await runConsoleChat({
        bot,
        team: CONSOLE_TEAM,
        user,
        input: io.stdin,
        output: io.stdout,
        interactive,
        chartsDir: values.charts ? resolve(values.charts) : join(dirname(dbPath), 'charts'),
        clock,
        afterLine: schedule.afterLine,
      }).finally(schedule.stop);
    } finally {
      store.close();
    }
    return 0;
  },
};
