import { formatAge, formatDuration, formatPercent, formatVolume } from '../replies/format.js';
import type { Table } from '../replies/reply.js';
import { shownVolume } from '../shown-volume.js';
import type { Store } from '../store/index.js';
import { type TankStatus, tankStatus } from '../tank-status.js';
import { dateFromNow, runwayIsOver } from './status-reply.js';

/** Every live tank's status, in code order. */
export function teamStatuses(store: Store, teamId: string, now: number): TankStatus[] {
  return store.tanks.list(teamId).flatMap((t) => {
    const s = tankStatus(store, teamId, t.id, now);
    return s ? [s] : [];
  });
}

/** One row per tank: the overview and the "running low" answers share it. */
export function tankTable(statuses: readonly TankStatus[], now: number, timeZone: string): Table {
  return {
    columns: ['tank', 'site', 'volume', 'full', 'runway', 'refill', 'last reading'],
    rows: statuses.map((s) => {
      const v = shownVolume(s);
      return [
        s.tank.code,
        s.tank.site ?? '',
        // A star marks a latest reading the forecast does not trust yet: the volume shown is the trusted one
        // (the question gives both).
        v ? `${formatVolume(v.volume, s.volumeUnit)}${v.unconfirmed !== undefined ? '*' : ''}` : '-',
        v ? formatPercent(v.fraction) : '-',
        runwayCell(s, now),
        refillCell(s, now, timeZone),
        s.latest ? formatAge(s.latest.time, now) : 'none',
      ];
    }),
  };
}

function runwayCell(s: TankStatus, now: number): string {
  const r = s.runway;
  if (!r || s.readingCount < 2) return '-';
  if (r.days === null) return s.filling ? 'not rising' : 'not falling';
  if (runwayIsOver(s, now)) return 'over';
  return formatDuration({
    value: r.days,
    ...(r.low !== null ? { low: r.low } : {}),
    high: r.high ?? Number.POSITIVE_INFINITY,
  });
}

function refillCell(s: TankStatus, now: number, timeZone: string): string {
  const p = s.refill;
  if (!p || s.readingCount < 2) return '-';
  const what = p.mode === 'pick-up' ? 'pick-up' : 'order';
  if (p.verdict === 'order-now') return `${what} now`;
  if (p.verdict === 'order-by' && p.orderBy !== null)
    return `${what} by ${dateFromNow(p.orderBy, now, timeZone)}`;
  return 'not yet';
}
