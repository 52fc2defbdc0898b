// Level -> volume for each shape, in metres and m^3. Each returns the function and the full height.
import { toLitres, toMetres } from '../units/index.js';
import { circularSegmentArea, sphericalCapVolume } from './circle.js';
import { type Head, headVolume, headVolumeFromApex, resolveHead } from './heads.js';
import { horizontalHeadVolumeFn } from './heads-horizontal.js';
import type { TankSpec } from './spec.js';

export interface ShapeModel {
  /** Metres. */
  fullHeight: number;
  /** Volume in m^3 at a level in metres, 0 <= h <= fullHeight. */
  volumeM3(h: number): number;
  /** Breakpoints (metres) where the formula changes branch; the inverse brackets between them. */
  joins: number[];
  /** The lowest level with a volume (metres): 0, or a strapping table's first row. */
  lowestLevel?: number;
}

export function shapeModel(spec: TankSpec): ShapeModel {
  const toM = toMetres(1, spec.units.length);
  switch (spec.shape) {
    case 'sphere': {
      const R = (spec.diameter * toM) / 2;
      return { fullHeight: 2 * R, volumeM3: (h) => sphericalCapVolume(R, h), joins: [R] };
    }
    case 'rectangular': {
      const area = spec.width * toM * spec.length * toM;
      return { fullHeight: spec.height * toM, volumeM3: (h) => area * h, joins: [] };
    }
    case 'horizontal-cylinder': {
      const R = (spec.diameter * toM) / 2;
      const L = spec.length * toM;
      const [first, second] = [spec.heads?.[0] ?? null, spec.heads?.[1] ?? null];
      const a = horizontalHeadVolumeFn(resolveHead(first, R, toM));
      // Two identical ends (the usual case) share one prepared head.
      const same = JSON.stringify(first) === JSON.stringify(second);
      if (same)
        return { fullHeight: 2 * R, volumeM3: (h) => L * circularSegmentArea(R, h) + 2 * a(h), joins: [R] };
      const b = horizontalHeadVolumeFn(resolveHead(second, R, toM));
      return { fullHeight: 2 * R, volumeM3: (h) => L * circularSegmentArea(R, h) + a(h) + b(h), joins: [R] };
    }
    case 'vertical-cylinder': {
      const R = (spec.diameter * toM) / 2;
      const L = spec.length * toM;
      const bottom = resolveHead(spec.heads?.[0], R, toM);
      const top = resolveHead(spec.heads?.[1], R, toM);
      return bottom.inward ? inwardBottomModel(R, L, bottom, top) : verticalModel(R, L, bottom, top);
    }
    case 'strapping': {
      const toM3 = toLitres(1, spec.units.volume) / 1000;
      const levels = spec.table.map(([level]) => level * toM);
      const volumes = spec.table.map(([, volume]) => volume * toM3);
      return {
        fullHeight: levels[levels.length - 1] ?? 0,
        volumeM3: (h) => interpolateTable(levels, volumes, h),
        joins: levels.slice(1, -1),
        lowestLevel: levels[0] ?? 0,
      };
    }
  }
}

/** Vertical cylinder, convex heads: bottom head from its apex, the shell, then the top head filled upward. */
function verticalModel(R: number, L: number, bottom: Head, top: Head): ShapeModel {
  const a1 = bottom.depth;
  const a2 = top.depth;
  const bottomFull = headVolume(bottom);
  const topFull = headVolume(top);
  const shellArea = Math.PI * R * R;
  return {
    fullHeight: a1 + L + a2,
    volumeM3: (h) => {
      if (h <= a1) return headVolumeFromApex(bottom, h);
      if (h <= a1 + L) return bottomFull + shellArea * (h - a1);
      const inTop = Math.min(h - a1 - L, a2);
      // The top head filled upward is the full head minus its empty cap, counted from the apex down.
      return bottomFull + shellArea * L + topFull - headVolumeFromApex(top, a2 - inTop);
    },
    joins: [a1, a1 + L],
  };
}

/**
 * Vertical cylinder whose bottom head is pushed up into the tank: the level is measured from the rim, and the
 * liquid fills the shell around the raised head, whose part below h is its full volume minus its top cap.
 */
function inwardBottomModel(R: number, L: number, bottom: Head, top: Head): ShapeModel {
  const a = bottom.depth;
  const bump = headVolume(bottom);
  const upper = verticalModel(R, L, { ...bottom, type: 'flat', depth: 0 }, top);
  return {
    fullHeight: upper.fullHeight,
    volumeM3: (h) => upper.volumeM3(h) - (h >= a ? bump : bump - headVolumeFromApex(bottom, a - h)),
    joins: [a, ...upper.joins],
  };
}

/** Linear interpolation in a table whose levels increase (binary search); the caller keeps h in range. */
export function interpolateTable(levels: readonly number[], values: readonly number[], h: number): number {
  let lo = 0;
  let hi = levels.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (levels[mid]! <= h) lo = mid;
    else hi = mid;
  }
  const l0 = levels[lo]!;
  const l1 = levels[hi]!;
  const v0 = values[lo]!;
  if (h <= l0) return v0;
  if (h >= l1) return values[hi]!;
  return v0 + ((values[hi]! - v0) * (h - l0)) / (l1 - l0);
}
