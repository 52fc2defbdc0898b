import { formatPercent, formatVolume } from './replies/format.js';
import type { TankStatus } from './tank-status.js';

/**
 * The volume a reply or notice gives as the tank's: the latest reading's, or, while that reading is
 * unconfirmed, the volume the estimate trusts (the one the runway and refill rest on), with the unconfirmed
 * one beside it. Answers, tables and notices all show the same number this way.
 */
export function shownVolume(
  s: TankStatus,
): { volume: number; fraction: number; unconfirmed?: number } | undefined {
  if (!s.latest) return undefined;
  if (s.latest.suspect && s.rate) {
    return { volume: s.rate.volume, fraction: s.rate.volume / s.capacity, unconfirmed: s.latest.volume };
  }
  return { volume: s.latest.volume, fraction: s.latest.fraction };
}

/** "470 gal (83%)"; "470 gal (83%); latest reading 610 gal not confirmed yet". */
export function volumeText(s: TankStatus): string {
  const v = shownVolume(s);
  if (!v) return 'no reading yet';
  const text = `${formatVolume(v.volume, s.volumeUnit)} (${formatPercent(v.fraction)})`;
  if (v.unconfirmed === undefined) return text;
  return `${text}; latest reading ${formatVolume(v.unconfirmed, s.volumeUnit)} not confirmed yet`;
}
