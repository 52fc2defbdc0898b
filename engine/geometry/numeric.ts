// Numerical helpers for the geometry: Gauss-Legendre rules, a stable x - sin x, and a bracketed root finder.

/** Nodes and weights of the n-point Gauss-Legendre rule on [0, 1] (Newton on P_n, Abramowitz & Stegun 25.4.29). */
export function gaussLegendre01(n: number): { nodes: Float64Array; weights: Float64Array } {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 1;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1;
      let p1 = x;
      for (let j = 2; j <= n; j++) {
        const p2 = ((2 * j - 1) * x * p1 - (j - 1) * p0) / j;
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-16) break;
    }
    nodes[i] = (1 - x) / 2;
    weights[i] = 1 / ((1 - x * x) * dp * dp);
  }
  return { nodes, weights };
}

/** x - sin(x) without the cancellation of the direct form for small x (Taylor series below 0.5). */
export function xMinusSin(x: number): number {
  if (Math.abs(x) >= 0.5) return x - Math.sin(x);
  const x2 = x * x;
  // x^3/3! - x^5/5! + ... ; 9 terms reach double precision for |x| < 0.5.
  let term = (x * x2) / 6;
  let sum = term;
  for (let k = 2; k < 10; k++) {
    term *= -x2 / (2 * k * (2 * k + 1));
    sum += term;
  }
  return sum;
}

/**
 * Root of an increasing function f on [lo, hi] with f(lo) <= 0 <= f(hi): Brent's method (R. P. Brent,
 * "Algorithms for Minimization without Derivatives", 1973, ch. 4): inverse quadratic interpolation
 * safeguarded by bisection, so it never leaves the bracket. Stops when the bracket is below xtol.
 * f(lo) and f(hi) may be passed in when the caller already knows them.
 */
export function brentRoot(
  f: (x: number) => number,
  lo: number,
  hi: number,
  xtol: number,
  fLo = f(lo),
  fHi = f(hi),
): number {
  let a = lo;
  let b = hi;
  let fa = fLo;
  let fb = fHi;
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa * fb > 0) return Math.abs(fa) < Math.abs(fb) ? a : b;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 0; iter < 200; iter++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}
