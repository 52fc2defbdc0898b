/**
 * Answers remembered by key, at most `limit` of them (the oldest is forgotten first): for work that is slow
 * to redo and asked for again and again (a shape's tabulation, a zone check, a date's text), in a process
 * that runs for months, so memory stays bounded. An answer may be `undefined`; it is remembered too.
 */
export class BoundedMemo<K, V> {
  private readonly answers = new Map<K, V>();

  constructor(private readonly limit: number) {}

  get(key: K, compute: (key: K) => V): V {
    const known = this.answers.get(key);
    if (known !== undefined || this.answers.has(key)) return known as V;
    const value = compute(key);
    if (this.answers.size >= this.limit) this.answers.delete(this.answers.keys().next().value as K);
    this.answers.set(key, value);
    return value;
  }
}
