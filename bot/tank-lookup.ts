import type { Store } from './store/index.js';
import type { Tank } from './store/types.js';

/** The names people may use for a team's tanks: each short code, and the full name when it differs. */
export function tankNamesOf(tanks: readonly Pick<Tank, 'code' | 'name'>[]): string[] {
  const names: string[] = [];
  for (const t of tanks) {
    names.push(t.code);
    if (t.name.toLowerCase() !== t.code.toLowerCase()) names.push(t.name);
  }
  return names;
}

/** The live tank a person named by code or full name (case-insensitive), within one team only. */
export function findTank(store: Store, teamId: string, name: string): Tank | undefined {
  const byCode = store.tanks.byCode(teamId, name);
  if (byCode) return byCode;
  const lower = name.toLowerCase();
  return store.tanks.list(teamId).find((t) => t.name.toLowerCase() === lower);
}
