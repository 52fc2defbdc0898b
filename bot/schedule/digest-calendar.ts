import type { Team } from '../store/types.js';
import {
  addLocalDays,
  checkTimeZone,
  formatLocalDate,
  instantOfLocal,
  isoWeekday,
  type LocalDate,
  localDateOf,
  parseWallTime,
} from './local-time.js';

/** One scheduled digest occurrence: the local date it belongs to and the instant it is due. */
export interface DigestOccurrence {
  teamId: string;
  channel: string;
  localDate: string;
  dueAt: number;
}

const DAY = 86_400_000;

/**
 * The digest occurrences of a team around local date `today`: `daysBack` days before it through today.
 * A team with no digest time or channel, or a zone/time the store holds but we cannot read, has none.
 */
function occurrencesAround(team: Team, today: LocalDate, zone: string, daysBack: number): DigestOccurrence[] {
  const time = team.digestTime ? parseWallTime(team.digestTime) : null;
  if (!time?.ok || !team.digestChannel) return [];
  const list: DigestOccurrence[] = [];
  for (let back = daysBack; back >= 0; back--) {
    const date = addLocalDays(today, -back);
    if (team.digestDays.length > 0 && !team.digestDays.includes(isoWeekday(date))) continue;
    list.push({
      teamId: team.id,
      channel: team.digestChannel,
      localDate: formatLocalDate(date),
      dueAt: instantOfLocal(date, time.value, zone),
    });
  }
  return list;
}

export interface DigestCalendar {
  /**
   * The occurrences due at or before `now` and no older than `lookbackMs` (the grace period plus a day, so
   * a miss is noticed and logged once), oldest first. Occurrences before the team existed were never owed.
   */
  due(team: Team, now: number, lookbackMs: number): DigestOccurrence[];
}

/**
 * Time-zone arithmetic is the costly part of a tick (luxon asks Intl for offsets), so each team's
 * occurrences are computed once per local day and reused until its settings or its local date change.
 */
export function createDigestCalendar(): DigestCalendar {
  const cache = new Map<
    string,
    { signature: string; from: number; until: number; list: DigestOccurrence[] }
  >();
  return {
    due(team, now, lookbackMs) {
      const zone = checkTimeZone(team.timeZone);
      if (!zone.ok || !team.digestTime || !team.digestChannel) return [];
      const daysBack = Math.ceil(lookbackMs / DAY) + 1;
      const signature = [
        team.timeZone,
        team.digestTime,
        team.digestChannel,
        team.digestDays.join(','),
        daysBack,
      ].join('|');
      let entry = cache.get(team.id);
      if (!entry || entry.signature !== signature || now < entry.from || now >= entry.until) {
        const today = localDateOf(now, zone.value);
        const midnight = { hour: 0, minute: 0 };
        entry = {
          signature,
          from: instantOfLocal(today, midnight, zone.value),
          until: instantOfLocal(addLocalDays(today, 1), midnight, zone.value),
          list: occurrencesAround(team, today, zone.value, daysBack),
        };
        cache.set(team.id, entry);
      }
      return entry.list.filter(
        (o) => o.dueAt <= now && o.dueAt >= now - lookbackMs && o.dueAt >= team.createdAt,
      );
    },
  };
}
