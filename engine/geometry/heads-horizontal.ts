// One head of a horizontal tank, partly filled to level h (metres from the bottom of the shell); volumes in m^3.
import { segmentAreaByChord } from './circle.js';
import { type Head, headVolume } from './heads.js';
import { gaussLegendre01 } from './numeric.js';

const RULE = gaussLegendre01(20);

/** Volume (m^3) of liquid in one head of a horizontal tank at level h (0 <= h <= 2R). */
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
      return (
        (a * R * R * Math.acos(1 - h / R)) / 3 +
        (a / (9 * R)) * Math.sqrt(Math.max(0, 2 * R * h - h * h)) * (2 * h - 3 * R) * (h + R)
      );
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
 * Conical head, level h <= R: a R^2 K / 3 with M = (R - h) / R and
 * K = acos M + M^3 acosh(1/M) - 2 M sqrt(1 - M^2) (D. Jones, "Calculating Tank Volume", horizontal cone).
 */
function conicalBelowAxis(R: number, a: number, h: number): number {
  const M = (R - h) / R;
  if (M <= 0) return (Math.PI * a * R * R) / 6;
  if (M >= 1) return 0;
  const K = Math.acos(M) + M * M * M * Math.acosh(1 / M) - 2 * M * Math.sqrt(1 - M * M);
  return (a * R * R * K) / 3;
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
    return arcIntegral(0, head.depth - rho, rho, 0, Math.asin(Math.min(1, head.radius / rho)), w);
  }
  const { dishRadius, knuckleRadius: rk, depth: a, radius: R } = head;
  const c = R - rk;
  const alpha = Math.asin(c / (dishRadius - rk));
  return (
    arcIntegral(0, a - dishRadius, dishRadius, 0, alpha, w) + arcIntegral(c, 0, rk, alpha, Math.PI / 2, w)
  );
}

function arcIntegral(rc: number, _xc: number, rho: number, t0: number, t1: number, w: number): number {
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
