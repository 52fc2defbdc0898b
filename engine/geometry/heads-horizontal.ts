// One head of a horizontal tank, partly filled to level h (metres from the bottom of the shell); volumes in m^3.

import { piecewiseChebyshev } from './chebyshev.js';
import { segmentAreaByChord } from './circle.js';
import { type Head, headVolume } from './heads.js';
import { gaussLegendre01 } from './numeric.js';

const RULE = gaussLegendre01(32);

/**
 * Level -> volume (m^3) of one head of a horizontal tank, ready for hot loops. Heads with a closed form use
 * it; spherical and torispherical heads are integrated numerically once per tank, at Chebyshev points in
 * theta (h = R (1 - cos theta), which makes the volume smooth up to the knuckle edge, where the pieces are
 * graded), and then evaluated from that interpolant, which reproduces the integral to about 1e-15 of the head.
 */
export function horizontalHeadVolumeFn(head: Head): (h: number) => number {
  const R = head.radius;
  const hemisphere = head.type === 'spherical' && head.depth >= R * (1 - 1e-12);
  if (hemisphere) {
    // A hemisphere is the ellipsoidal head with depth = R, in closed form.
    const asEllipsoid: Head = { ...head, type: 'ellipsoidal' };
    return (h) => horizontalHeadVolume(asEllipsoid, h);
  }
  if (head.type !== 'spherical' && head.type !== 'torispherical') return (h) => horizontalHeadVolume(head, h);
  // Near theta = 0 a nearly hemispherical cap integrates less smoothly: grade toward that end too.
  const breaks: number[] = head.type === 'spherical' ? [0] : [];
  if (head.type === 'torispherical') {
    // The liquid line touching the circle where the dish meets the knuckle (radius r1 about the axis).
    const r1 = ((R - head.knuckleRadius) * head.dishRadius) / (head.dishRadius - head.knuckleRadius);
    breaks.push(Math.acos(Math.min(1, r1 / R)));
  }
  const belowAxis = piecewiseChebyshev(
    (theta) => revolvedHeadBelowAxis(head, R * Math.cos(theta)),
    0,
    Math.PI / 2,
    breaks,
    16,
    11,
    12,
  );
  const full = headVolume(head);
  const thetaOf = (h: number) => 2 * Math.asin(Math.sqrt(h / (2 * R)));
  return (h) => {
    if (h <= 0) return 0;
    if (h >= 2 * R) return full;
    return h <= R ? Math.max(0, belowAxis(thetaOf(h))) : full - Math.max(0, belowAxis(thetaOf(2 * R - h)));
  };
}

/** Volume (m^3) of liquid in one head of a horizontal tank at level h (0 <= h <= 2R), evaluated directly. */
export function horizontalHeadVolume(head: Head, h: number): number {
  const R = head.radius;
  const a = head.depth;
  switch (head.type) {
    case 'flat':
      return 0;
    case 'ellipsoidal':
      // Half of pi a h^2 (1 - h / (3R)), the two-head form (D. Jones, "Calculating Tank Volume").
      return 0.5 * Math.PI * a * h * h * (1 - h / (3 * R));
    case 'guppy':
      // D. Jones, "Calculating Tank Volume", guppy head (one head: half the two-head expression).
      return guppyHead(R, a, h);
    case 'conical':
      return h > R ? headVolume(head) - conicalBelowAxis(R, a, 2 * R - h) : conicalBelowAxis(R, a, h);
    case 'spherical':
    case 'torispherical':
      // The head is symmetric about the tank axis: above mid-height, full head minus the empty part.
      return h > R
        ? headVolume(head) - revolvedHeadBelowAxis(head, R - (2 * R - h))
        : revolvedHeadBelowAxis(head, R - h);
  }
}

/**
 * Guppy head: a R^2 theta / 3 + a / (9R) sqrt(2Rh - h^2) (2h - 3R) (h + R) with theta = acos(1 - h/R)
 * (D. Jones, "Calculating Tank Volume"; one head is half the two-head expression; written from memory of
 * that form and confirmed by the fluids 1.0.22 reference vectors in test/). theta and the root are
 * formed from h and 2R - h so that a thin layer, or a nearly full head, keeps its digits; the two terms
 * still cancel there, so rounding is clamped to [0, full].
 */
function guppyHead(R: number, a: number, h: number): number {
  const theta =
    h <= R
      ? 2 * Math.asin(Math.sqrt(h / (2 * R)))
      : Math.PI - 2 * Math.asin(Math.sqrt((2 * R - h) / (2 * R)));
  const v =
    (a * R * R * theta) / 3 +
    (a / (9 * R)) * Math.sqrt(Math.max(0, h * (2 * R - h))) * (2 * h - 3 * R) * (h + R);
  return Math.min((Math.PI * a * R * R) / 3, Math.max(0, v));
}

/**
 * Conical head, level h <= R: a R^2 K / 3 with M = (R - h) / R and
 * K = acos M + M^3 acosh(1/M) - 2 M sqrt(1 - M^2) (D. Jones, "Calculating Tank Volume", horizontal cone;
 * written from memory of that form and confirmed by the fluids 1.0.22 reference vectors in test/).
 */
function conicalBelowAxis(R: number, a: number, h: number): number {
  const e = h / R;
  const M = 1 - e;
  if (M <= 0) return (Math.PI * a * R * R) / 6;
  if (e <= 0) return 0;
  // Each term from e = h/R, not from M, so a thin layer keeps its digits: acos M = 2 asin sqrt(e/2),
  // sqrt(1 - M^2) = sqrt(e (2 - e)), acosh(1/M) = log1p((e + sqrt(e (2 - e))) / M).
  const root = Math.sqrt(e * (2 - e));
  const K = 2 * Math.asin(Math.sqrt(e / 2)) + M * M * M * Math.log1p((e + root) / M) - 2 * M * root;
  return Math.max(0, (a * R * R * K) / 3);
}

/**
 * A head of revolution about the tank axis, built from circular arcs (spherical: one arc; torispherical: dish
 * and knuckle). Each arc is r(t) = rc + rho sin t, x(t) = xc + rho cos t; liquid below the line at distance
 * w >= 0 under the axis fills, in the disc of radius r at axial position x, the segment
 * r^2 acos(w/r) - w sqrt(r^2 - w^2); the head volume is its integral over x. No closed form covers the
 * torispherical knuckle, so this integrates numerically (20-point Gauss-Legendre per arc; where the disc edge
 * meets the liquid line the integrand behaves like (t - t*)^(3/2), removed by t = t* + (t1 - t*) u^2).
 */
function revolvedHeadBelowAxis(head: Head, w: number): number {
  if (w >= head.radius) return 0;
  if (head.type === 'spherical') {
    const rho = head.dishRadius;
    return arcIntegral(0, rho, 0, Math.asin(Math.min(1, head.radius / rho)), w);
  }
  const { dishRadius, knuckleRadius: rk, radius: R } = head;
  const c = R - rk;
  const alpha = Math.asin(c / (dishRadius - rk));
  return arcIntegral(0, dishRadius, 0, alpha, w) + arcIntegral(c, rk, alpha, Math.PI / 2, w);
}

/** One arc's share: the integral over t in [t0, t1] of segment(r(t), w) |dx/dt|, |dx/dt| = rho sin t. */
function arcIntegral(rc: number, rho: number, t0: number, t1: number, w: number): number {
  const rEnd = rc + rho * Math.sin(t1);
  if (rEnd <= w) return 0;
  const rStart = rc + rho * Math.sin(t0);
  const { nodes, weights } = RULE;
  let sum = 0;
  if (rStart >= w) {
    const span = t1 - t0;
    for (let i = 0; i < nodes.length; i++) {
      const t = t0 + span * nodes[i]!;
      sum += weights[i]! * segmentAreaByChord(rc + rho * Math.sin(t), w) * Math.sin(t);
    }
    return sum * span * rho;
  }
  const tStar = Math.asin((w - rc) / rho);
  const span = t1 - tStar;
  for (let i = 0; i < nodes.length; i++) {
    const u = nodes[i]!;
    const t = tStar + span * u * u;
    sum += weights[i]! * segmentAreaByChord(rc + rho * Math.sin(t), w) * Math.sin(t) * 2 * u;
  }
  return sum * span * rho;
}
