// Level -> volume and volume -> level evaluations per second for each shape family, against a plain
// circular-segment evaluation timed in the same run; where python3 with fluids (the reference library of the
// geometry tests: fluids, Caleb Bell, MIT) is installed, also against fluids on the same inputs.
import { execFileSync } from 'node:child_process';
import { circularSegmentArea } from '../../engine/geometry/circle.js';
import { buildTank, type HeadSpec, type Tank, type TankSpec } from '../../engine/geometry/index.js';
import { type BenchRow, type BenchSection, opsPerSecond } from '../harness.js';

interface Family {
  name: string;
  spec: TankSpec;
  /** The same tank as fluids arguments (TANK keywords, or a function name), when fluids has it. */
  fluids?: Record<string, unknown>;
}

const units = { length: 'm', volume: 'L' } as const;
const D = 2.4;
const L = 6;
const heads: Record<string, HeadSpec> = {
  flat: { type: 'flat' },
  conical: { type: 'conical', depth: 0.6 },
  ellipsoidal: { type: 'ellipsoidal', depth: 0.6 },
  spherical: { type: 'spherical', depth: 0.5 },
  torispherical: { type: 'torispherical', f: 1, k: 0.06 },
  guppy: { type: 'guppy', depth: 0.6 },
};

function cylinderFamily(orientation: 'horizontal' | 'vertical', kind: string): Family {
  const head = heads[kind]!;
  const fluidsHead =
    kind === 'flat'
      ? { sideA: null, sideB: null }
      : kind === 'torispherical'
        ? { sideA: kind, sideB: kind, sideA_f: head.f, sideA_k: head.k, sideB_f: head.f, sideB_k: head.k }
        : { sideA: kind, sideB: kind, sideA_a: head.depth, sideB_a: head.depth };
  return {
    name: `${orientation}-cylinder ${kind}`,
    spec: { units, shape: `${orientation}-cylinder`, diameter: D, length: L, heads: [head, head] },
    fluids: { tank: { D, L, horizontal: orientation === 'horizontal', ...fluidsHead } },
  };
}

const FAMILIES: Family[] = [
  ...['flat', 'conical', 'ellipsoidal', 'spherical', 'torispherical', 'guppy'].map((k) =>
    cylinderFamily('horizontal', k),
  ),
  ...['flat', 'conical', 'ellipsoidal', 'spherical', 'torispherical'].map((k) =>
    cylinderFamily('vertical', k),
  ),
  {
    name: 'vertical-cylinder inward torispherical bottom',
    spec: {
      units,
      shape: 'vertical-cylinder',
      diameter: D,
      length: L,
      heads: [{ ...heads.torispherical!, inward: true }, null],
    },
  },
  { name: 'sphere', spec: { units, shape: 'sphere', diameter: D }, fluids: { sphere: D } },
  { name: 'rectangular', spec: { units, shape: 'rectangular', width: 2, length: 3, height: 2 } },
  {
    name: 'strapping (100 rows)',
    spec: {
      units,
      shape: 'strapping',
      table: Array.from({ length: 100 }, (_, i): [number, number] => [i * 0.02, 1000 * (i * 0.02) ** 1.5]),
    },
  },
];

const SAMPLES = 1024;

/** ops/s after a short untimed warm-up, so the first family measured is not also the one the JIT learns on. */
function warmOpsPerSecond(fn: (i: number) => unknown): number {
  opsPerSecond(fn, 50);
  return opsPerSecond(fn);
}

/** Evenly spread but shuffled inputs, so branch prediction does not learn one level. */
function samples(tank: Tank): { levels: Float64Array; volumes: Float64Array } {
  const levels = new Float64Array(SAMPLES);
  let seed = 12345;
  for (let i = 0; i < SAMPLES; i++) {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    levels[i] = tank.lowestLevel + (tank.fullHeight - tank.lowestLevel) * (seed / 2147483648);
  }
  const volumes = levels.map((h) => tank.volumeAt(h));
  return { levels, volumes };
}

const FLUIDS_SCRIPT = `
import json, sys, time
import fluids
job = json.load(sys.stdin)
def rate(fn, xs):
    n, total = 0, 0.0
    while total < 0.3:
        t = time.perf_counter()
        for x in xs: fn(x)
        total += time.perf_counter() - t
        n += len(xs)
    return n / total
out = {}
for fam in job:
    f = fam['fluids']
    if 'sphere' in f:
        D = f['sphere']
        fwd = rate(lambda h: fluids.geometry.V_partial_sphere(D, h), fam['levels'])
        out[fam['name']] = {'forward': fwd}
    else:
        T = fluids.geometry.TANK(**f['tank'])
        fwd = rate(T.V_from_h, fam['levels'])
        inv = rate(lambda v: T.h_from_V(v, method='brenth'), fam['volumes'][:100])
        out[fam['name']] = {'forward': fwd, 'inverse': inv}
print(json.dumps(out))
`;

/** ops/s of fluids on the same inputs, or null when python3 with fluids is not installed. */
function timeFluids(
  jobs: { name: string; fluids: Record<string, unknown>; levels: number[]; volumes: number[] }[],
) {
  // The Debian package installs into the system python, which may not be the first python3 on PATH.
  const python = ['python3', '/usr/bin/python3'].find((exe) => {
    try {
      execFileSync(exe, ['-c', 'import fluids'], { stdio: 'ignore', timeout: 20_000 });
      return true;
    } catch {
      return false;
    }
  });
  if (!python) return null;
  const out = execFileSync(python, ['-c', FLUIDS_SCRIPT], { input: JSON.stringify(jobs), timeout: 300_000 });
  return JSON.parse(out.toString()) as Record<string, { forward: number; inverse?: number }>;
}

/**
 * Building a tank the first time (validation, the inverse's bracket table, a tabulated head): every call gets
 * a new length so the cache of recent tanks does not answer. Baseline: a rectangular tank, built the same way.
 */
function buildRows(): BenchRow[] {
  const fresh = (spec: TankSpec) => (i: number) => {
    const varied = { ...spec, length: ('length' in spec ? spec.length : 1) + i * 1e-9 } as TankSpec;
    return buildTank(varied).ok ? 1 : 0;
  };
  const baseline = {
    name: 'building a rectangular tank',
    value: opsPerSecond(fresh(FAMILIES.find((f) => f.name === 'rectangular')!.spec), 200),
  };
  return [
    'horizontal-cylinder torispherical',
    'horizontal-cylinder spherical',
    'vertical-cylinder torispherical',
  ].map(
    (name): BenchRow => ({
      name: `building a ${name} tank`,
      value: opsPerSecond(fresh(FAMILIES.find((f) => f.name === name)!.spec), 200),
      unit: 'tanks/s',
      baseline,
    }),
  );
}

export const geometrySection: BenchSection = {
  title: 'geometry: level <-> volume per shape family (one core)',
  async run(): Promise<BenchRow[]> {
    const rows: BenchRow[] = [];
    // Baseline: the plain circular segment times a length, the core of every horizontal-cylinder evaluation.
    const baseLevels = new Float64Array(SAMPLES).map((_, i) => (((i * 7919) % SAMPLES) / SAMPLES) * D);
    const segment = {
      name: 'plain circular segment',
      value: warmOpsPerSecond((i) => L * circularSegmentArea(D / 2, baseLevels[i & (SAMPLES - 1)]!)),
    };
    const fluidsJobs: {
      name: string;
      fluids: Record<string, unknown>;
      levels: number[];
      volumes: number[];
    }[] = [];
    for (const family of FAMILIES) {
      const built = buildTank(family.spec);
      if (!built.ok) throw new Error(`${family.name}: ${built.error}`);
      const tank = built.value;
      const { levels, volumes } = samples(tank);
      const forward = warmOpsPerSecond((i) => tank.volumeAt(levels[i & (SAMPLES - 1)]!));
      const inverse = warmOpsPerSecond((i) => tank.levelAt(volumes[i & (SAMPLES - 1)]!));
      rows.push({
        name: `${family.name}: level->volume`,
        value: forward,
        unit: 'ops/s',
        baseline: segment,
        goal: '>= 1e6 ops/s',
      });
      rows.push({
        name: `${family.name}: volume->level`,
        value: inverse,
        unit: 'ops/s',
        baseline: segment,
        goal: '>= 2e5 ops/s',
      });
      if (family.fluids) {
        // fluids works in m and m^3; the same levels, the volumes converted from litres.
        fluidsJobs.push({
          name: family.name,
          fluids: family.fluids,
          levels: [...levels.slice(0, 200)],
          volumes: [...volumes.slice(0, 200)].map((v) => v / 1000),
        });
      }
    }
    rows.push(...buildRows());
    const fluids = timeFluids(fluidsJobs);
    if (!fluids) {
      rows.push({
        name: 'fluids comparison skipped: python3 with fluids is not installed',
        value: 0,
        unit: '',
      });
      return rows;
    }
    for (const job of fluidsJobs) {
      const theirs = fluids[job.name];
      const ours = rows.find((r) => r.name === `${job.name}: level->volume`)!;
      const oursInverse = rows.find((r) => r.name === `${job.name}: volume->level`)!;
      if (theirs?.forward)
        rows.push({
          name: `${job.name}: level->volume vs fluids`,
          value: ours.value,
          unit: 'ops/s',
          baseline: { name: 'fluids', value: theirs.forward },
          goal: '>= 10x',
        });
      if (theirs?.inverse)
        rows.push({
          name: `${job.name}: volume->level vs fluids`,
          value: oursInverse.value,
          unit: 'ops/s',
          baseline: { name: 'fluids', value: theirs.inverse },
          goal: '>= 10x',
        });
    }
    return rows;
  },
};
