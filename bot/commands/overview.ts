import { formatDateTime } from '../replies/format.js';
import { defineHandler } from './handler.js';
import { tankTable, teamStatuses } from './tank-table.js';

/** "all": every tank in one table. */
export const overviewHandler = defineHandler({
  type: 'overview',
  run: (_command, { store, request, now, timeZone }) => {
    const statuses = teamStatuses(store, request.team, now);
    if (statuses.length === 0) {
      return [
        {
          kind: 'answer',
          visibility: 'channel',
          headline:
            'No tanks yet. Add one: `add tank T4 vertical-cylinder diameter=48in length=72in unit=gal`.',
        },
      ];
    }
    const team = store.teams.get(request.team);
    const urgent = statuses.filter((s) => s.refill?.verdict === 'order-now').map((s) => s.tank.code);
    return [
      {
        kind: 'answer',
        visibility: 'channel',
        headline: `${statuses.length} tank${statuses.length === 1 ? '' : 's'}${urgent.length ? `; order now: ${urgent.join(', ')}` : ''}${team?.demo ? ' [DEMO DATA]' : ''}`,
        table: tankTable(statuses, now, timeZone),
        facts: [
          { label: 'As of', value: `${formatDateTime(now, timeZone)} (${timeZone})` },
          ...(statuses.some((s) => s.latest?.suspect)
            ? [{ label: '*', value: 'latest reading not confirmed yet: ask about the tank for details' }]
            : []),
        ],
      },
    ];
  },
});
