import { IANAZone } from 'luxon';

/** An IANA zone name luxon (and so every reply and schedule) can use. */
export const isValidTimeZone = (zone: string): boolean => IANAZone.isValidZone(zone);
