/**
 * The scheduler in the terminal: digests and notices are printed as they fire, marked so they read apart
 * from answers. The console's clock can jump (`/now ...` in scripts), so besides a timer the chat ticks the
 * scheduler after every line with its own clock: a replayed fortnight shows each morning's digest.
 */
import { repliesToPlainText } from '../../bot/replies/plainText.js';
import {
  createScheduler,
  type Deliver,
  type ScheduleEvent,
  startLoop,
} from '../../bot/schedule/scheduler.js';
import type { Store } from '../../bot/store/open-store.js';

export interface ConsoleSchedule {
  /** Ticks the scheduler at the console's time; the chat calls it after each line. */
  afterLine(now: number): Promise<void>;
  /** Stops the timer and gives the lease up. */
  stop(): void;
}

const LABEL: Record<string, string> = { digest: 'morning digest', notice: 'notice', stale: 'reminder' };

/** Prints a post with a one-line banner naming what it is and where it would go. */
export function consoleDeliver(output: { write(text: string): unknown }): Deliver {
  return (_team, channel, replies, meta) => {
    output.write(`[${LABEL[meta.kind] ?? meta.kind} to #${channel}]\n${repliesToPlainText(replies)}\n\n`);
  };
}

export function consoleSchedule(options: {
  store: Store;
  output: { write(text: string): unknown };
  clock: () => number;
  /** Where skipped or failed posts are reported (stderr); claimed/delivered are not worth a line. */
  log?: (line: string) => void;
  /** Timer period for an interactive session; 0 for none (piped scripts tick after each line). */
  intervalMs?: number;
}): ConsoleSchedule {
  const report = (event: ScheduleEvent) => {
    if (event.type === 'skipped' || event.type === 'expired' || event.type === 'delivery-failed') {
      options.log?.(
        `schedule: ${event.type} ${event.post.kind} ${event.post.key}: ${'reason' in event ? event.reason : event.error}`,
      );
    }
  };
  const scheduler = createScheduler({
    store: options.store,
    deliver: consoleDeliver(options.output),
    clock: options.clock,
    // The console is often closed overnight: a digest missed by up to 3 hours still shows on opening.
    graceMinutes: 180,
    log: report,
  });
  const stopLoop = options.intervalMs ? startLoop(scheduler, options.intervalMs, report) : () => {};
  return {
    afterLine: async (now) => {
      await scheduler.tick(now);
    },
    stop: () => {
      stopLoop();
      if (options.store.db.open) scheduler.release();
    },
  };
}
