/** JSON columns are written only by this store, but a hand-edited file must not crash a reply: fall back. */
export function parseJsonColumn<T>(text: string | null | undefined, fallback: T): T {
  if (text === null || text === undefined) return fallback;
  try {
    return JSON.parse(text) as T;
  } catch {
    return fallback;
  }
}
