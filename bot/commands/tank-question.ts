import { formatDateTime } from '../replies/format.js';
import { volumeText } from '../shown-volume.js';
import { tankStatus } from '../tank-status.js';
import { defineHandler, privateError } from './handler.js';
import { resolveTank } from './resolve-tank.js';
import {
  levelChart,
  runwayIsOver,
  runwayText,
  statusCaution,
  statusFacts,
  verdictText,
} from './status-reply.js';

/** "T4?": volume, rate with its basis, runway with its range and date, refill suggestion, chart. */
export const tankQuestionHandler = defineHandler({
  type: 'tank-question',
  run: (command, context) => {
    const { store, request, now, timeZone } = context;
    const tank = resolveTank(context, command.tank);
    if (!tank.ok) return [privateError(tank.error)];
    const status = tankStatus(store, request.team, tank.value.id, now)!;
    if (!status.latest) {
      return [
        {
          kind: 'answer',
          visibility: 'channel',
          headline: `${tank.value.code}: no reading yet. Log one like \`${tank.value.code} 60in\`.`,
        },
      ];
    }
    const caution = statusCaution(status);
    const isDemo = store.teams.get(request.team)?.demo === true;
    const demo = isDemo ? ' [DEMO DATA]' : '';
    const verdict = runwayIsOver(status, now) ? verdictText(status) : undefined;
    return [
      {
        kind: 'answer',
        visibility: 'channel',
        headline: `${tank.value.code}${tank.value.site ? ` (${tank.value.site})` : ''}: ${volumeText(status)}, runway ${runwayText(status, now, timeZone)}${verdict ? `; ${verdict}` : ''}${demo}`,
        facts: [
          ...statusFacts(status, now, timeZone),
          { label: 'As of', value: formatDateTime(now, timeZone) },
        ],
        chart: levelChart(status, timeZone, isDemo),
        ...(caution ? { caution } : {}),
      },
    ];
  },
});
