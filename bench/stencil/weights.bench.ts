/**
 * Stencil-weight benchmarks (group `stencil`):
 *
 * - S1: `fornbergWeights` (float64) on 10⁵ random stencils of 5 to 9 nodes,
 *   derivative 1 to 4, jittered around 0; `us_per_stencil`.
 * - S2: exact rational weights of the named stencils, `centralStencil(m, p)`
 *   for m = 1, 2 and p = 2, 4, …, 12, `forwardStencil(m, p)` for m = 1, 2 and
 *   p = 1 … 12; time per stencil (weights, accuracy and leading error term).
 *
 * Node sets are drawn before timing from a seeded PRNG.
 *
 * @module
 */
import { centralStencil, fornbergWeights, forwardStencil, type Stencil } from '../../src/index.js';
import {
  type BenchCase, type BenchContext, calibrate, measure, mulberry32, note, printLine,
} from '../harness.js';

const COUNT = 100_000;

interface NodeSet {
  readonly derivative: number;
  readonly nodes: Float64Array;
}

/** Node sets with N = 5 … 9 nodes jittered by up to ±0.4 around integer offsets, m = 1 … 4. */
function randomNodeSets(count: number, seed: number): NodeSet[] {
  const rand = mulberry32(seed);
  const sets: NodeSet[] = [];
  for (let s = 0; s < count; s++) {
    const n = 5 + Math.floor(rand() * 5);
    const first = -Math.floor(rand() * n);
    const nodes = new Float64Array(n);
    for (let j = 0; j < n; j++) nodes[j] = first + j + 0.8 * (rand() - 0.5);
    const derivative = 1 + Math.floor(rand() * 4);
    sets.push({ derivative, nodes });
  }
  return sets;
}

function runFornberg(ctx: Readonly<BenchContext>): void {
  const sets = randomNodeSets(COUNT, 0x5eed);
  const { timing } = measure(() => {
    let check = 0;
    for (let s = 0; s < sets.length; s++) {
      const w = fornbergWeights(sets[s].derivative, sets[s].nodes);
      check += w[0];
    }
    return check;
  }, { runs: ctx.runs });
  const per = (t: number) => t / COUNT;
  printLine({
    id: 'S1', impl: 'quadrille', variant: 'fornberg-float64', path: 'ts',
    size: { nodes: '5-9', count: COUNT },
    timing: { ...timing, median: per(timing.median), min: per(timing.min), max: per(timing.max), times: timing.times.map(per) },
    figures: { us_per_stencil: per(timing.median) * 1e6 },
  });
}

function timeStencil(
  ctx: Readonly<BenchContext>, kind: 'central' | 'forward', m: number, p: number,
  make: () => Stencil,
): void {
  const body = () => make().weights[0];
  const repeat = calibrate(body);
  const { timing } = measure(body, { runs: ctx.runs, repeat, warmup: 1 });
  const st = make();
  printLine({
    id: 'S2', impl: 'quadrille', variant: `exact-${kind}`, path: 'ts',
    size: { m, p, nodes: st.offsets.length },
    timing,
    figures: { us_per_stencil: timing.median * 1e6 },
  });
}

function runExact(ctx: Readonly<BenchContext>): void {
  note('S2 times are per stencil (median over runs of a calibrated batch)');
  for (const m of [1, 2]) {
    for (let p = 2; p <= 12; p += 2) timeStencil(ctx, 'central', m, p, () => centralStencil(m, p));
  }
  for (const m of [1, 2]) {
    for (let p = 1; p <= 12; p++) timeStencil(ctx, 'forward', m, p, () => forwardStencil(m, p));
  }
}

/** The stencil group's cases, in run order. */
export const cases: readonly BenchCase[] = [
  { id: 'S1', group: 'stencil', title: 'fornbergWeights on 1e5 random 5-9 node stencils', run: runFornberg },
  { id: 'S2', group: 'stencil', title: 'exact central (p = 2…12) and forward (p = 1…12) stencils, m = 1, 2', run: runExact },
];
