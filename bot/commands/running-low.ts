import { defineHandler } from './handler.js';
import { tankTable, teamStatuses } from './tank-table.js';

/** "which tanks run low this week?": tanks whose threshold or runway end comes before `until`. */
export const runningLowHandler = defineHandler({
  type: 'running-low',
  run: (command, { store, request, now, timeZone }) => {
    const low = teamStatuses(store, request.team, now).filter((s) => {
      const when = s.refill?.thresholdAt ?? s.runway?.at ?? null;
      return s.refill?.verdict === 'order-now' || (when !== null && when <= command.until);
    });
    if (low.length === 0) {
      return [{ kind: 'answer', visibility: 'channel', headline: `No tank runs low ${command.window}.` }];
    }
    return [
      {
        kind: 'answer',
        visibility: 'channel',
        headline: `${low.length} tank${low.length === 1 ? '' : 's'} run${low.length === 1 ? 's' : ''} low ${command.window}: ${low.map((s) => s.tank.code).join(', ')}`,
        table: tankTable(low, now, timeZone),
      },
    ];
  },
});
