export type { AuditRepo, NewAuditEntry } from './audit.js';
export { UNDOABLE_ACTIONS } from './audit.js';
export type { Migration } from './migrations.js';
export { migrate, migrations } from './migrations.js';
export type { OpenStoreOptions, Store } from './open-store.js';
export { openStore } from './open-store.js';
export type * from './types.js';
