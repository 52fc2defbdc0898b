import Database from 'better-sqlite3';
import { type AuditRepo, auditRepo } from './audit.js';
import { type DeliveriesRepo, deliveriesRepo } from './deliveries.js';
import { type Migration, migrate, migrations } from './migrations.js';
import { type PendingExchangesRepo, pendingExchangesRepo } from './pending-exchanges.js';
import { type ProcessedRequestsRepo, processedRequestsRepo } from './processed-requests.js';
import { type RateCacheRepo, rateCacheRepo } from './rate-cache.js';
import { type ReadingsRepo, readingsRepo } from './readings.js';
import { type TanksRepo, tanksRepo } from './tanks.js';
import { type TeamsRepo, teamsRepo } from './teams.js';

/**
 * The bot's one store. Every method takes the team id, and every query filters on it. Callers wrap a whole
 * command in `transaction` so a command changes the store all at once or not at all.
 */
export interface Store {
  teams: TeamsRepo;
  tanks: TanksRepo;
  readings: ReadingsRepo;
  deliveries: DeliveriesRepo;
  audit: AuditRepo;
  processedRequests: ProcessedRequestsRepo;
  pending: PendingExchangesRepo;
  rateCache: RateCacheRepo;
  /** Runs `fn` in one SQLite transaction (nested calls become savepoints); a throw rolls everything back. */
  transaction<T>(fn: () => T): T;
  /** The open database, for parts that keep their own tables (bot/schedule appends its migrations). */
  db: Database.Database;
  path: string;
  close(): void;
}

export interface OpenStoreOptions {
  /** Extra migrations (tests); the shared list in migrations.ts is the normal source. */
  migrations?: Migration[];
}

/** Largest part of the file read through a memory map (1 GiB: a store of 1,000 teams x 50 tanks is 235 MB). */
const MMAP_BYTES = 2 ** 30;

/** Opens (or creates) the SQLite file with WAL, foreign keys on, and every migration applied. */
export function openStore(path: string, options: OpenStoreOptions = {}): Store {
  const db = new Database(path);
  try {
    db.pragma('journal_mode = WAL');
    // FULL syncs the WAL on every commit: a confirmed reading survives a power cut, not only a killed process.
    db.pragma('synchronous = FULL');
    db.pragma('foreign_keys = ON');
    db.pragma('busy_timeout = 5000');
    // Reads through a memory map rather than read() into SQLite's 2 MB page cache: a morning digest reads
    // every tank's rate-cache row (with migration 6's index, 1,000 teams' digests went from 2.1 s to 1.5 s on
    // npm run bench digest). Address space only; SQLite maps no more than the file. Writes go through the WAL.
    db.pragma(`mmap_size = ${MMAP_BYTES}`);
    migrate(db, options.migrations ?? migrations);
  } catch (error) {
    db.close();
    throw error;
  }
  return {
    teams: teamsRepo(db),
    tanks: tanksRepo(db),
    readings: readingsRepo(db),
    deliveries: deliveriesRepo(db),
    audit: auditRepo(db),
    processedRequests: processedRequestsRepo(db),
    pending: pendingExchangesRepo(db),
    rateCache: rateCacheRepo(db),
    transaction: <T>(fn: () => T): T => db.transaction(fn)(),
    db,
    path,
    close: () => {
      if (db.open) db.close();
    },
  };
}
