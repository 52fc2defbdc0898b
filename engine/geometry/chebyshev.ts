// Piecewise Chebyshev interpolation: a fast stand-in for a smooth function that is costly to evaluate.

export type PiecewiseChebyshev = (x: number) => number;

/**
 * Interpolates f on [a, b], split at `breaks` (where f may lose smoothness) into pieces of about equal width,
 * each a Chebyshev series of `degree` fitted at Chebyshev points of the first kind (L. N. Trefethen,
 * "Approximation Theory and Approximation Practice", ch. 3-4). Toward each break the pieces halve in width
 * `grading` times, so a weak singularity there (a (x - x0)^(5/2) term) still converges quickly.
 * Evaluation by Clenshaw's recurrence.
 */
export function piecewiseChebyshev(
  f: (x: number) => number,
  a: number,
  b: number,
  breaks: readonly number[],
  pieces: number,
  degree: number,
  grading = 0,
): PiecewiseChebyshev {
  const inner = breaks.filter((x) => x > a && x < b);
  const step = (b - a) / pieces;
  // A break at an end (a or b) grades the pieces toward that end.
  const graded = breaks
    .filter((x) => x >= a && x <= b)
    .flatMap((x0) =>
      Array.from({ length: grading }, (_, k) => step * 2 ** -(k + 1)).flatMap((d) => [x0 - d, x0 + d]),
    );
  const edges = [a, ...[...inner, ...graded].filter((x) => x > a && x < b).sort((p, q) => p - q), b];
  const starts: number[] = [];
  const widths: number[] = [];
  for (let s = 0; s + 1 < edges.length; s++) {
    const lo = edges[s]!;
    const hi = edges[s + 1]!;
    const count = Math.max(1, Math.round((pieces * (hi - lo)) / (b - a)));
    for (let i = 0; i < count; i++) {
      starts.push(lo + ((hi - lo) * i) / count);
      widths.push((hi - lo) / count);
    }
  }
  const n = degree + 1;
  const coefficients = new Float64Array(starts.length * n);
  const values = new Float64Array(n);
  starts.forEach((start, p) => {
    const width = widths[p]!;
    for (let k = 0; k < n; k++) {
      const t = Math.cos((Math.PI * (k + 0.5)) / n);
      values[k] = f(start + ((t + 1) * width) / 2);
    }
    for (let j = 0; j < n; j++) {
      let sum = 0;
      for (let k = 0; k < n; k++) sum += values[k]! * Math.cos((Math.PI * j * (k + 0.5)) / n);
      coefficients[p * n + j] = ((j === 0 ? 1 : 2) / n) * sum;
    }
  });
  const pieceStarts = Float64Array.from(starts);
  const pieceWidths = Float64Array.from(widths);
  const last = starts.length - 1;
  return (x: number): number => {
    // Pieces are few and sorted: a short linear scan from a guess beats a binary search here.
    let p = Math.min(last, Math.max(0, Math.floor(((x - a) / (b - a)) * (last + 1))));
    while (p > 0 && x < pieceStarts[p]!) p--;
    while (p < last && x >= pieceStarts[p + 1]!) p++;
    const t = (2 * (x - pieceStarts[p]!)) / pieceWidths[p]! - 1;
    const t2 = 2 * t;
    let b1 = 0;
    let b2 = 0;
    const base = p * n;
    for (let j = n - 1; j >= 1; j--) {
      const b0 = coefficients[base + j]! + t2 * b1 - b2;
      b2 = b1;
      b1 = b0;
    }
    return coefficients[base]! + t * b1 - b2;
  };
}
