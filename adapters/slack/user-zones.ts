/**
 * The sender's IANA time zone from users.info (Slack's profile `tz`), cached: a person's zone rarely changes
 * and a lookup per message would cost a Web API call each time. A failed lookup gives no zone (the bot then
 * uses the team's) and is retried after a short while, not on every message.
 */
export type ZoneLookup = (teamId: string, userId: string) => Promise<string | undefined>;

export interface UserZones {
  zoneOf(teamId: string, userId: string): Promise<string | undefined>;
}

interface Entry {
  zone: Promise<string | undefined>;
  until: number;
}

export const zoneTtlMs = 6 * 60 * 60 * 1000;
export const failedLookupTtlMs = 5 * 60 * 1000;
const MAX_ENTRIES = 50_000;

export function createUserZones(lookup: ZoneLookup, clock: () => number = Date.now): UserZones {
  const cache = new Map<string, Entry>();
  return {
    zoneOf(teamId, userId) {
      const key = `${teamId}:${userId}`;
      const now = clock();
      const hit = cache.get(key);
      if (hit && hit.until > now) return hit.zone;
      if (cache.size >= MAX_ENTRIES) cache.delete(cache.keys().next().value as string);
      const entry: Entry = { zone: Promise.resolve(undefined), until: now + zoneTtlMs };
      // Concurrent messages from one person share one lookup.
      entry.zone = lookup(teamId, userId).then(
        (zone) => {
          if (zone === undefined) entry.until = clock() + failedLookupTtlMs;
          return zone;
        },
        () => {
          entry.until = clock() + failedLookupTtlMs;
          return undefined;
        },
      );
      cache.set(key, entry);
      return entry.zone;
    },
  };
}
