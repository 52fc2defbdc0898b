/**
 * The notice state machine, one per tank and rule, stored so a restart neither repeats nor loses a notice.
 *
 *   armed --(margin <= 0: the tank crossed its limit)--> fired      emits one notice
 *   fired --(margin >= band: recovered past the band)--> armed      silent; re-arms the rule
 *
 * `margin` is how far the tank is on the safe side of its limit (volume above the low threshold, days of
 * runway above the minimum, room below a high level), in the unit the rule's band uses. A noisy sensor that
 * wobbles around the limit by less than the band cannot fire twice: only a real recovery re-arms.
 */
export type NoticeState = 'armed' | 'fired';

export type NoticeTransition = 'none' | 'crossed' | 'recovered';

export interface NoticeStep {
  state: NoticeState;
  transition: NoticeTransition;
}

export function stepNotice(state: NoticeState, margin: number, band: number): NoticeStep {
  // A margin we cannot compute (no rate yet, bad data) leaves the state alone rather than firing or re-arming.
  if (!Number.isFinite(margin)) return { state, transition: 'none' };
  if (state === 'armed' && margin <= 0) return { state: 'fired', transition: 'crossed' };
  if (state === 'fired' && margin >= Math.max(0, band)) return { state: 'armed', transition: 'recovered' };
  return { state, transition: 'none' };
}

/** Runs the machine over a series of margins; the count of 'crossed' is the number of notices it would send. */
export function crossingsOf(margins: readonly number[], band: number, start: NoticeState = 'armed'): number {
  let state = start;
  let crossed = 0;
  for (const margin of margins) {
    const step = stepNotice(state, margin, band);
    state = step.state;
    if (step.transition === 'crossed') crossed++;
  }
  return crossed;
}
