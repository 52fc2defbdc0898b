// The safety factor k (a z-score) for a cycle service level: the standard normal quantile.
// vega-statistics (the statistics part of the chart library, loaded alone so the CLI starts fast) inverts the
// error function with Giles' approximation ("Approximating the erfinv function", GPU Computing Gems 2, 2010).
import { quantileNormal } from 'vega-statistics';

/** k such that P(Z <= k) = serviceLevel for a standard normal Z; serviceLevel in [0.5, 1). */
export function serviceFactor(serviceLevel: number): number {
  return quantileNormal(serviceLevel, 0, 1);
}
