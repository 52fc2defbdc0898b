/** Errors are values with a message a person can act on; the engine never throws for bad user input. */
export type Result<T> = { ok: true; value: T } | { ok: false; error: string };

export const ok = <T>(value: T): Result<T> => ({ ok: true, value });
export const fail = (error: string): { ok: false; error: string } => ({ ok: false, error });
