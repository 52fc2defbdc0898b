// Tank heads in metres: their dimensions, and the volume of a head filled from its apex (vertical tanks).
import { sphericalCapVolume } from './circle.js';
import type { HeadSpec, HeadType } from './spec.js';

/** A head with every dimension in metres; `depth` is how far it reaches beyond the straight shell. */
export interface Head {
  readonly type: HeadType;
  readonly radius: number;
  readonly depth: number;
  readonly inward: boolean;
  /** Spherical: the sphere's radius; torispherical: the dish (crown) radius. */
  readonly dishRadius: number;
  /** Torispherical only: knuckle radius, and the depth (from the apex) where the dish meets the knuckle. */
  readonly knuckleRadius: number;
  readonly dishDepth: number;
}

/**
 * Torispherical head depth from D, f and k: a = fD (1 - cos alpha) + kD cos alpha with
 * sin alpha = (1 - 2k) / (2 (f - k)) (D. Jones, "Calculating Tank Volume"; the fluids library's
 * `a_torispherical` documents the same relation).
 */
export function torisphericalDepth(diameter: number, f: number, k: number): number {
  const alpha = Math.asin((1 - 2 * k) / (2 * (f - k)));
  return f * diameter * (1 - Math.cos(alpha)) + k * diameter * Math.cos(alpha);
}

/** Resolves a head of the tank JSON (lengths already scaled to metres by `toM`). */
export function resolveHead(spec: HeadSpec | null | undefined, radius: number, toM: number): Head {
  const type = spec?.type ?? 'flat';
  const inward = spec?.inward === true;
  if (type === 'torispherical' && spec?.f !== undefined && spec.k !== undefined) {
    const diameter = 2 * radius;
    const dish = spec.f * diameter;
    const knuckle = spec.k * diameter;
    const alpha = Math.asin((1 - 2 * spec.k) / (2 * (spec.f - spec.k)));
    const depth = torisphericalDepth(diameter, spec.f, spec.k);
    return {
      type,
      radius,
      depth,
      inward,
      dishRadius: dish,
      knuckleRadius: knuckle,
      dishDepth: dish * (1 - Math.cos(alpha)),
    };
  }
  const given = type === 'flat' ? 0 : (spec?.depth ?? 0) * toM;
  // A head of no depth is a flat end; a spherical cap a rounding hair deeper than the radius is a hemisphere.
  if (given === 0)
    return { type: 'flat', radius, depth: 0, inward, dishRadius: 0, knuckleRadius: 0, dishDepth: 0 };
  const depth = type === 'spherical' ? Math.min(given, radius) : given;
  const dishRadius = type === 'spherical' ? (radius * radius + depth * depth) / (2 * depth) : 0;
  return { type, radius, depth, inward, dishRadius, knuckleRadius: 0, dishDepth: depth };
}

/** Volume (m^3) of a head of revolution about a vertical axis, filled from its apex to height z (0 <= z <= depth). */
export function headVolumeFromApex(head: Head, z: number): number {
  const { radius: R, depth: a } = head;
  switch (head.type) {
    case 'flat':
    case 'guppy':
      return 0;
    case 'conical':
      // Cone of radius R z / a: pi R^2 z^3 / (3 a^2) (CRC tables, frustum of a cone).
      return (Math.PI * R * R * z * z * z) / (3 * a * a);
    case 'ellipsoidal':
      // Semi-ellipsoid with r^2 = R^2 (2 a z - z^2) / a^2 integrated over z (CRC tables, ellipsoid segment).
      return (Math.PI * R * R * (a * z * z - (z * z * z) / 3)) / (a * a);
    case 'spherical':
      return sphericalCapVolume(head.dishRadius, z);
    case 'torispherical':
      return torisphericalVolumeFromApex(head, z);
  }
}

/**
 * Torispherical head from the apex: a spherical cap (dish) up to the dish-knuckle tangent, then the knuckle,
 * a torus section of radius r_k about a ring of radius c = R - r_k, whose cross-section radius is
 * c + sqrt(r_k^2 - u^2) at height u below the tangent line; pi times its square integrates in closed form
 * (D. Jones, "Compute Fluid Volumes in Vertical Tanks", 2003, worked out here term by term).
 */
function torisphericalVolumeFromApex(head: Head, z: number): number {
  const { dishRadius, knuckleRadius: rk, dishDepth: z1, depth: a, radius: R } = head;
  if (z <= z1) return sphericalCapVolume(dishRadius, z);
  const c = R - rk;
  const antiderivative = (u: number) => {
    const s = Math.sqrt(Math.max(0, rk * rk - u * u));
    const ratio = Math.min(1, Math.max(-1, u / rk));
    return (c * c + rk * rk) * u - (u * u * u) / 3 + c * (u * s + rk * rk * Math.asin(ratio));
  };
  return sphericalCapVolume(dishRadius, z1) + Math.PI * (antiderivative(z - a) - antiderivative(z1 - a));
}

/** Volume of the whole head (m^3). */
export function headVolume(head: Head): number {
  if (head.type === 'guppy') return (Math.PI * head.depth * head.radius * head.radius) / 3;
  return headVolumeFromApex(head, head.depth);
}
