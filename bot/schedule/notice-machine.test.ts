import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { crossingsOf, stepNotice } from './notice-machine.js';

/** A seeded pseudo-random generator (mulberry32) so the noisy series are the same on every run. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('stepNotice', () => {
  it('fires once on crossing and re-arms only past the band', () => {
    expect(stepNotice('armed', 3, 5)).toEqual({ state: 'armed', transition: 'none' });
    expect(stepNotice('armed', 0, 5)).toEqual({ state: 'fired', transition: 'crossed' });
    expect(stepNotice('fired', -2, 5)).toEqual({ state: 'fired', transition: 'none' });
    expect(stepNotice('fired', 4.9, 5)).toEqual({ state: 'fired', transition: 'none' });
    expect(stepNotice('fired', 5, 5)).toEqual({ state: 'armed', transition: 'recovered' });
  });

  it('leaves the state alone when the margin is unknown', () => {
    expect(stepNotice('armed', Number.NaN, 5).transition).toBe('none');
    expect(stepNotice('fired', Number.POSITIVE_INFINITY, 5).transition).toBe('none');
  });
});

describe('hysteresis on a noisy sensor series', () => {
  // A tank level (percent) sampled every 15 minutes with +-1.5 points of sensor noise: it drains from 40% to
  // 15% across a 20% low limit, is refilled to 80%, and drains across the limit again. Two real crossings.
  function noisyLevels(seed: number): number[] {
    const random = seeded(seed);
    const noise = () => (random() * 2 - 1) * 1.5;
    const levels: number[] = [];
    for (let i = 0; i < 400; i++) levels.push(40 - (25 * i) / 400 + noise());
    for (let i = 0; i < 50; i++) levels.push(15 + noise()); // sits below the limit, still noisy
    for (let i = 0; i < 600; i++) levels.push(80 - (65 * i) / 600 + noise());
    return levels;
  }
  const limit = 20;
  const band = 5; // re-arm 5 points above the limit: wider than the noise's full swing (3 points)

  it('gives one notice per real crossing and none from noise', () => {
    for (const seed of [1, 2, 3, 42, 2026]) {
      const margins = noisyLevels(seed).map((level) => level - limit);
      expect(crossingsOf(margins, band)).toBe(2);
    }
  });

  it('would chatter without the band (the reason it exists)', () => {
    const margins = noisyLevels(7).map((level) => level - limit);
    expect(crossingsOf(margins, 0)).toBeGreaterThan(2);
  });

  it('never fires more often than the margin truly crosses from band to zero (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { maxLength: 200 }), (margins) => {
        // Count the real excursions: from at-or-above the band (or the start) down to at-or-below zero.
        let excursions = 0;
        let high = true;
        for (const m of margins) {
          if (high && m <= 0) {
            excursions++;
            high = false;
          } else if (!high && m >= band) high = true;
        }
        expect(crossingsOf(margins, band)).toBe(excursions);
      }),
    );
  });
});
