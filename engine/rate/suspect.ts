// Why a reading looks wrong: plain-language reasons the bot can turn into "did you mean ...?".

/** Factors a unit slip multiplies a volume by (cm for in, gal for L, imp gal for L, one decade, ft for m). */
const SLIP_FACTORS: readonly [number, string][] = [
  [2.54, 'centimetres typed for inches?'],
  [3.785411784, 'US gallons and litres mixed up?'],
  [4.54609, 'imperial gallons and litres mixed up?'],
  [10, 'a decimal point slipped?'],
  [3.28084, 'feet and metres mixed up?'],
];

/** The unit-slip explanation for a reading that is about a known factor off the expected volume, if any. */
export function unitSlipReason(reading: number, expected: number): string | null {
  if (!(reading > 0) || !(expected > 0)) return null;
  const ratio = reading / expected;
  for (const [factor, why] of SLIP_FACTORS) {
    for (const f of [factor, 1 / factor]) {
      if (Math.abs(ratio / f - 1) < 0.06) {
        return `about ${ratio.toFixed(2)}x the expected ${Math.round(expected)} L: ${why}`;
      }
    }
  }
  return null;
}

/** Reason text for a reading that is far from the expected volume (not yet known to be an event). */
export function deviationReason(reading: number, expected: number): string {
  const slip = unitSlipReason(reading, expected);
  if (slip) return slip;
  const direction = reading > expected ? 'above' : 'below';
  return `${Math.round(Math.abs(reading - expected))} L ${direction} the expected ${Math.round(expected)} L: a typo or a one-off spike?`;
}
