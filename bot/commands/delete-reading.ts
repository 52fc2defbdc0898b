import { DateTime } from 'luxon';
import { formatDateTime } from '../replies/format.js';
import { defineHandler, privateError } from './handler.js';
import { softDeleteReading } from './reading-edits.js';
import { resolveTank } from './resolve-tank.js';

/** How far back "delete the 7:30 reading" looks: the newest readings only, not all history. */
const LOOKBACK = 200;

/** "delete the 7:30 reading [of T4]": the newest reading taken at that local clock time. */
export const deleteReadingHandler = defineHandler({
  type: 'delete-reading',
  run: (command, context) => {
    const { store, request, now, timeZone } = context;
    let tankId: number | undefined;
    if (command.tank) {
      const tank = resolveTank(context, command.tank);
      if (!tank.ok) return [privateError(tank.error)];
      tankId = tank.value.id;
    }
    const match = store.readings.newest(request.team, LOOKBACK, tankId).find((r) => {
      const local = DateTime.fromMillis(r.time, { zone: timeZone });
      return local.hour === command.hour && local.minute === command.minute;
    });
    const clock = `${String(command.hour).padStart(2, '0')}:${String(command.minute).padStart(2, '0')}`;
    if (!match) {
      return [
        privateError(
          `No recent reading was taken at ${clock} (${timeZone})${command.tank ? ` on ${command.tank}` : ''}.`,
        ),
      ];
    }
    softDeleteReading(store, request, match.id, 'reading.delete', now);
    return [
      {
        kind: 'confirmation',
        visibility: 'channel',
        headline: `Deleted the reading "${match.rawText}" of ${formatDateTime(match.time, timeZone)}; figures are recomputed without it.`,
        facts: [{ label: 'Kept', value: 'in the audit trail' }],
      },
    ];
  },
});
