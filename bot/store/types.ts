/** Rows as the rest of the bot sees them: camelCase, instants in epoch ms (UTC), JSON columns parsed. */

export type Role = 'admin' | 'member';

export interface Team {
  id: string;
  name: string | null;
  /** IANA zone; 'UTC' until someone sets it. */
  timeZone: string;
  /** Local "HH:MM" for the morning digest, or null when no digest is set. */
  digestTime: string | null;
  /** ISO weekdays (1 = Monday) the digest goes out on; empty = every day. */
  digestDays: number[];
  digestChannel: string | null;
  demo: boolean;
  createdAt: number;
}

export interface Member {
  teamId: string;
  userId: string;
  name: string | null;
  role: Role;
  createdAt: number;
}

/**
 * Per-tank planning settings: the keys of the refill contract (cli-contract.md §5) with volumes in litres, the
 * engine's base unit, so they pass to engine/refill as they are; the team's zone is added at use.
 */
export interface TankSettings {
  /** A tank that fills (waste, backwash): rises are use, and the plan is a pick-up before it is full. */
  filling?: boolean;
  threshold?: { percent: number } | { volume: number } | { runwayDays: number };
  leadTimeDays?: number;
  businessDays?: boolean;
  orderCutoffHour?: number;
  deliveryWeekdays?: number[];
  /** Local whole hours [from, to) a delivery arrives within; absent = any time of the day. */
  deliveryHours?: [number, number];
  minimumOrder?: number;
  orderIncrement?: number;
  safeFillPercent?: number;
  serviceLevel?: number;
}

export interface Tank {
  teamId: string;
  id: number;
  /** The short code people type ("T4"); unique per team among live tanks, case-insensitive. */
  code: string;
  name: string;
  site: string | null;
  /** Free text such as "diesel" or "sodium hypochlorite 12.5%"; drives the cautions. */
  product: string | null;
  /** The tank specification JSON of cli-contract.md §1, validated by engine/geometry before it is stored. */
  spec: unknown;
  settings: TankSettings;
  createdBy: string;
  createdAt: number;
  updatedAt: number;
}

export interface NewTank {
  code: string;
  name?: string;
  site?: string | null;
  product?: string | null;
  spec: unknown;
  settings?: TankSettings;
}

/** How a reading was given: a level from the bottom, an ullage (space from the top), a percent, or a volume. */
export type ReadingKind = 'level' | 'ullage' | 'percent' | 'volume';

/** 'held' = kept aside as suspect until the sender confirms it; not used for any figure. */
export type ReadingStatus = 'ok' | 'held';

/** A reading exactly as entered: value and unit as typed, so a corrected tank shape recomputes history. */
export interface NewReading {
  tankId: number;
  time: number;
  kind: ReadingKind;
  value: number;
  /** The unit as typed: a length unit for level/ullage, '%' for percent, a volume unit for volume. */
  unit: string;
  rawText: string;
  userId: string;
  status?: ReadingStatus;
}

export interface Reading extends Required<NewReading> {
  id: number;
  teamId: string;
  createdAt: number;
}

export interface NewDelivery {
  tankId: number;
  time: number;
  volume: number;
  unit: string;
  ticket?: string | null;
  rawText: string;
  userId: string;
}

export interface Delivery extends NewDelivery {
  id: number;
  teamId: string;
  ticket: string | null;
  createdAt: number;
}

export interface AuditEntry {
  id: number;
  teamId: string;
  userId: string;
  at: number;
  action: string;
  target: string | null;
  targetId: number | null;
  detail: Record<string, unknown>;
  undoneAt: number | null;
}

/** A conversation that waits for the sender's next message (guided setup, strapping rows, "did you mean?"). */
export interface PendingExchange {
  teamId: string;
  channel: string;
  userId: string;
  kind: string;
  state: Record<string, unknown>;
  createdAt: number;
}
