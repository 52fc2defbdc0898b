// Closed forms for circles and spheres; lengths in metres, areas in m^2, volumes in m^3.
import { xMinusSin } from './numeric.js';

/**
 * Area of a circle of radius r below a horizontal line at height h above its lowest point (0 <= h <= 2r):
 * the circular segment r^2 (theta - sin theta cos theta) with cos theta = 1 - h/r (any engineering
 * handbook, e.g. Perry's Chemical Engineers' Handbook, or the CRC Standard Mathematical Tables).
 * Written with the half angle and a series for x - sin x so a thin layer keeps its digits.
 */
export function circularSegmentArea(r: number, h: number): number {
  // Away from the bottom and top the direct handbook form loses at most a digit and is the fastest.
  if (h >= 0.05 * r && h <= 1.95 * r) {
    const d = r - h;
    return r * r * Math.acos(d / r) - d * Math.sqrt(h * (2 * r - h));
  }
  if (h > r) return Math.PI * r * r - circularSegmentArea(r, 2 * r - h);
  if (h <= 0) return 0;
  const theta = 2 * Math.asin(Math.sqrt(h / (2 * r)));
  return 0.5 * r * r * xMinusSin(2 * theta);
}

/** Volume of a spherical cap of height z on a sphere of radius rho: pi z^2 (3 rho - z) / 3 (CRC tables). */
export function sphericalCapVolume(rho: number, z: number): number {
  return (Math.PI * z * z * (3 * rho - z)) / 3;
}

/**
 * Area of a circle of radius r (centre at the origin) below the line y = -w, for r >= |w|:
 * r^2 acos(w / r) - w sqrt(r^2 - w^2) (the circular segment again, by its chord's distance w from the centre).
 */
export function segmentAreaByChord(r: number, w: number): number {
  if (w >= r) return 0;
  if (w <= -r) return Math.PI * r * r;
  return r * r * Math.acos(w / r) - w * Math.sqrt(r * r - w * w);
}
