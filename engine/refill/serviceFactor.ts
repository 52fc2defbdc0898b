// The safety factor k (a z-score) for a cycle service level: the standard normal quantile.
// vega (already a dependency, for charts) re-exports vega-statistics' quantileNormal, which inverts the
// error function with Giles' approximation ("Approximating the erfinv function", GPU Computing Gems 2, 2010).
import * as vega from 'vega';

// vega's type declarations omit its statistics helpers; this is the one function used, with its real signature.
const { quantileNormal } = vega as unknown as {
  quantileNormal(p: number, mean?: number, stdev?: number): number;
};

/** k such that P(Z <= k) = serviceLevel for a standard normal Z; serviceLevel in [0.5, 1). */
export function serviceFactor(serviceLevel: number): number {
  return quantileNormal(serviceLevel, 0, 1);
}
