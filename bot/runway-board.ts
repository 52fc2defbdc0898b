/**
 * The team's tanks by runway, shortest first, as one Reply: what a chat platform's home screen shows (the
 * Slack App Home tab). Built only from the pieces the answers and the digest already use (teamStatuses,
 * byRunway, tankTable), so it says what they say; adapters get it through a function, never the store.
 */
import { tankTable, teamStatuses } from './commands/tank-table.js';
import type { Reply } from './replies/reply.js';
import { byRunway } from './schedule/digest-sections.js';
import type { Store } from './store/index.js';

export function runwayBoard(store: Store, teamId: string, now: number): Reply {
  const team = store.teams.get(teamId);
  const timeZone = team?.timeZone ?? 'UTC';
  const statuses = byRunway(teamStatuses(store, teamId, now));
  if (statuses.length === 0) {
    return {
      kind: 'answer',
      visibility: 'sender',
      headline:
        'No tanks yet. Add one with the button above, or send `add tank T4 vertical-cylinder diameter=48in length=72in unit=gal`.',
    };
  }
  return {
    kind: 'answer',
    visibility: 'sender',
    headline: `${statuses.length} tank${statuses.length === 1 ? '' : 's'}, shortest runway first${team?.demo ? ' [DEMO DATA]' : ''}`,
    table: tankTable(statuses, now, timeZone),
  };
}
