/**
 * W2 (group `linalg`): steady Poisson −Δu = f on the unit square, zero
 * Dirichlet, n × n interior unknowns (n + 1 cells per side, boundary nodes
 * stored as identity rows), f = −Δu exactly for u = exp(x + y)·sin(πx)·sin(πy),
 * relative residual 1e-8; W2-3D the same on the unit cube with
 * u = exp(x + y + z)·sin(πx)·sin(πy)·sin(πz), n = 127.
 *
 * The system is built by `discretize(…).system({ source })` outside the
 * timed body. Each timed run builds the multigrid hierarchy and solves, so
 * `median_s` is set-up + solve (what a caller pays, and what spsolve's time
 * with its factorisation compares with); `setup_s` and `solve_s` are the
 * medians of the two parts, `warmup_setup_s` the untimed first set-up (for
 * the first variant of a size: in a fresh process, before the JIT has
 * compiled the set-up's loops). Variants:
 *
 * - `mg-pcg`: conjugate gradients preconditioned by one V(1,1)-cycle
 *   (a small PCG loop below, on `csrKernel`, the product every CSR-backed
 *   operator uses: stencil runs from its second call);
 * - `mg-v`: multigrid alone, V(1,1)-cycles (`Multigrid.solve`);
 * - `mg-fmg`: one full-multigrid pass, then V-cycles.
 *
 * `iters` counts CG iterations or cycles; `max_err` is max|u_h − u| over the
 * nodes (O(h²)). A full garbage collection runs untimed before every run
 * (and after the assembly), so `peak_rss_mb` is what one solve holds. Each size is its own case, so in `npm run bench` it runs in
 * its own process and `peak_rss_mb` is that size's alone (assembly
 * included). Run standalone with `npx tsx bench/linalg/w2.bench.ts [sizes…]`,
 * which does the same, one child process per size.
 *
 * @module
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import v8 from 'node:v8';
import vm from 'node:vm';
import { discretize, grid } from '../../src/index.js';
import { createMultigrid, type Multigrid } from '../../src/linalg/multigrid.js';
import { createSineTransformSolver, sineStencil } from '../../src/linalg/sine-transform.js';
import type { CsrMatrix } from '../../src/operator/matrix.js';
import { csrKernel } from '../../src/operator/matrix.js';
import { type BenchCase, type BenchContext, median, measure, note, printLine } from '../harness.js';

const TOL = 1e-8;

/**
 * A full garbage collection, run untimed before each timed run: each run
 * drops the previous run's hierarchy (~100 MB at n = 1023), and without it
 * peak RSS would measure how late V8 collects rather than what a solve needs.
 */
const collect: () => void = (() => {
  const exposed = (globalThis as { gc?: () => void }).gc;
  if (exposed !== undefined) return exposed;
  try {
    v8.setFlagsFromString('--expose-gc');
    return vm.runInNewContext('gc') as () => void;
  } catch {
    return () => {};
  }
})();

/** An assembled W2 system and the exact solution at its nodes. */
interface Problem {
  readonly g: ReturnType<typeof grid>;
  readonly a: CsrMatrix;
  readonly rhs: Float64Array;
  readonly prescribed: Uint8Array;
  readonly exact: Float64Array;
}

/** ∂²/∂s² of e^s·sin(πs), divided by e^s: sin(πs) + 2π cos(πs) − π² sin(πs). */
function d2(s: number): number {
  const p = Math.PI;
  return Math.sin(p * s) + 2 * p * Math.cos(p * s) - p * p * Math.sin(p * s);
}

function build(n: number, dim: 2 | 3): Problem {
  const cells = n + 1;
  const ax = { from: 0, to: 1, cells };
  const p = Math.PI;
  const s = Math.sin;
  if (dim === 2) {
    const g = grid({ x: ax, y: ax });
    const d = discretize(g, { boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] });
    const f = (x: number, y: number): number => -Math.exp(x + y) * (d2(x) * s(p * y) + d2(y) * s(p * x));
    const sys = d.system({ source: f });
    const exact = new Float64Array(g.size);
    const c = g.x.coordinates;
    for (let i = 0; i <= cells; i++) {
      for (let j = 0; j <= cells; j++) exact[i * (cells + 1) + j] = Math.exp(c[i] + c[j]) * s(p * c[i]) * s(p * c[j]);
    }
    return { g, a: sys.matrix.matrix, rhs: sys.rhs, prescribed: Uint8Array.from(d.prescribed), exact };
  }
  const g = grid({ x: ax, y: ax, z: ax });
  const d = discretize(g, {
    boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax', 'zmin', 'zmax'], kind: 'dirichlet', value: 0 }],
  });
  const f = (x: number, y: number, z: number): number =>
    -Math.exp(x + y + z) * (d2(x) * s(p * y) * s(p * z) + d2(y) * s(p * x) * s(p * z) + d2(z) * s(p * x) * s(p * y));
  const sys = d.system({ source: f });
  const exact = new Float64Array(g.size);
  const c = g.x.coordinates;
  const m = cells + 1;
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      for (let k = 0; k < m; k++) {
        exact[(i * m + j) * m + k] = Math.exp(c[i] + c[j] + c[k]) * s(p * c[i]) * s(p * c[j]) * s(p * c[k]);
      }
    }
  }
  return { g, a: sys.matrix.matrix, rhs: sys.rhs, prescribed: Uint8Array.from(d.prescribed), exact };
}

/** Vectors of the PCG loop, made once per size. */
interface PcgWork {
  readonly x: Float64Array;
  readonly r: Float64Array;
  readonly z: Float64Array;
  readonly p: Float64Array;
  readonly q: Float64Array;
}

function pcgWork(n: number): PcgWork {
  return { x: new Float64Array(n), r: new Float64Array(n), z: new Float64Array(n), p: new Float64Array(n), q: new Float64Array(n) };
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/**
 * Preconditioned conjugate gradients from x = 0 with z = M r one multigrid
 * cycle; stops when the recurred ‖r‖/‖b‖ ≤ tol and confirms with the true
 * residual. Returns the iterations and the true relative residual.
 */
function pcg(multiply: (x: Float64Array, y: Float64Array) => Float64Array, b: Float64Array, mg: Multigrid, tol: number, w: PcgWork): { iterations: number; residual: number } {
  const { x, r, z, p, q } = w;
  const n = b.length;
  x.fill(0);
  r.set(b);
  const bn = Math.sqrt(dot(b, b));
  mg.precondition(r, z);
  p.set(z);
  let rz = dot(r, z);
  let it = 0;
  for (; it < 200;) {
    multiply(p, q);
    const alpha = rz / dot(p, q);
    let rr = 0;
    for (let i = 0; i < n; i++) {
      x[i] += alpha * p[i];
      const ri = r[i] - alpha * q[i];
      r[i] = ri;
      rr += ri * ri;
    }
    it++;
    if (Math.sqrt(rr) <= tol * bn) break;
    mg.precondition(r, z);
    const rzNew = dot(r, z);
    const beta = rzNew / rz;
    rz = rzNew;
    for (let i = 0; i < n; i++) p[i] = z[i] + beta * p[i];
  }
  multiply(x, q);
  let rr = 0;
  for (let i = 0; i < n; i++) rr += (b[i] - q[i]) * (b[i] - q[i]);
  return { iterations: it, residual: Math.sqrt(rr) / bn };
}

function maxErr(u: Float64Array, exact: Float64Array): number {
  let e = 0;
  for (let i = 0; i < u.length; i++) {
    const d = Math.abs(u[i] - exact[i]);
    if (!(d <= e)) e = d; // NaN propagates
  }
  return e;
}

type Variant = 'mg-pcg' | 'mg-v' | 'mg-fmg' | 'sine-transform';

/**
 * The peers' medians on this machine (../shared/peers/RESULTS.md: scipy
 * spsolve with its factorisation, and unpreconditioned scipy CG on the same
 * right-hand side, W2x there), by n; their n = 256, 512, 1024 differ from
 * 255, 511, 1023 by under 1 %.
 */
const PEERS: Readonly<Record<number, { spsolve: number; cg: number }>> = {
  255: { spsolve: 0.517, cg: 0.368 },
  511: { spsolve: 3.11, cg: 4.08 },
  1023: { spsolve: 23.7, cg: 39 },
};

function runOne(id: string, n: number, dim: 2 | 3, variants: readonly Variant[], runs: number): void {
  const { g, a, rhs, prescribed, exact } = build(n, dim);
  collect();
  const work = pcgWork(rhs.length);
  const multiply = csrKernel(a);
  for (const variant of variants) {
    const setups: number[] = [];
    const solves: number[] = [];
    let iters = 0;
    let residual = NaN;
    let sizes: readonly number[] = [];
    let u = work.x;
    const { timing } = measure(() => {
      const t0 = process.hrtime.bigint();
      // set-up, then the solve it returns
      let solve: () => { iterations: number; residual: number; solution: Float64Array };
      if (variant === 'sine-transform') {
        const st = createSineTransformSolver(g.shape, a, sineStencil(g.shape, a, prescribed)!, TOL);
        solve = () => {
          const r = st.solve(rhs, work.x);
          return { iterations: r.solves, residual: r.residual, solution: work.x };
        };
      } else {
        const mg = createMultigrid(g, a, { prescribed });
        sizes = mg.sizes;
        solve = variant === 'mg-pcg'
          ? () => ({ ...pcg(multiply, rhs, mg, TOL, work), solution: work.x })
          : () => mg.solve(rhs, { tolerance: TOL, fullMultigrid: variant === 'mg-fmg' });
      }
      const t1 = process.hrtime.bigint();
      const r = solve();
      const t2 = process.hrtime.bigint();
      iters = r.iterations;
      residual = r.residual;
      u = r.solution;
      setups.push(Number(t1 - t0) / 1e9);
      solves.push(Number(t2 - t1) / 1e9);
      return u;
    }, { runs, warmup: 1, setup: collect });
    if (!(residual <= TOL)) throw new Error(`${id} ${variant} n=${n}: relative residual ${residual} > ${TOL}`);
    // the warm-up run is first in both lists
    printLine({
      id, impl: 'quadrille', variant, path: 'ts', size: { n }, timing,
      figures: {
        iters, max_err: maxErr(u, exact), setup_s: median(setups.slice(1)), solve_s: median(solves.slice(1)),
        warmup_setup_s: setups[0], levels: sizes.length,
      },
    });
    const peer = id === 'W2' ? PEERS[n] : undefined;
    if (peer !== undefined) {
      note(`${id} ${variant} n=${n}: ${(peer.spsolve / timing.median).toFixed(0)}× scipy spsolve (${peer.spsolve} s), ` +
        `${(peer.cg / timing.median).toFixed(0)}× scipy CG (${peer.cg} s), set-up included (peers' medians from RESULTS.md)`);
    }
  }
}

/** The sizes of W2 (n interior per side) and W2-3D. */
export const W2_SIZES: readonly number[] = [255, 511, 1023];
/** The size of W2-3D. */
export const W2_3D_SIZES: readonly number[] = [127];

/**
 * Runs W2 at the given sizes (default 255, 511, 1023) in this process and
 * prints one line per size and variant. At least 5 timed runs after one
 * warm-up (the harness's floor), `ctx.runs` if larger, capped at 5 for
 * n ≥ 1023 to keep the case under a minute.
 */
export function runW2(ctx: Readonly<BenchContext>, sizes: readonly number[] = W2_SIZES): void {
  for (const n of sizes) runOne('W2', n, 2, ['mg-pcg', 'mg-v', 'mg-fmg', 'sine-transform'], n >= 1023 ? 5 : ctx.runs);
}

/** Runs W2-3D (n = 127 by default) in this process: `mg-pcg`, `mg-v` and `sine-transform`, 5 timed runs. */
export function runW2x3D(ctx: Readonly<BenchContext>, sizes: readonly number[] = W2_3D_SIZES): void {
  void ctx;
  for (const n of sizes) runOne('W2-3D', n, 3, ['mg-pcg', 'mg-v', 'sine-transform'], 5);
}

/** The linalg group's cases: one per size, so each gets its own process and peak RSS. */
export const cases: readonly BenchCase[] = [
  ...W2_SIZES.map((n): BenchCase => ({
    id: 'W2', name: `W2-mg-${n}`, group: 'linalg', title: `Poisson n=${n}: multigrid PCG, V-cycles, FMG`,
    run: (ctx) => runW2(ctx, [n]),
  })),
  ...W2_3D_SIZES.map((n): BenchCase => ({
    id: 'W2-3D', name: `W2-3D-mg-${n}`, group: 'linalg', title: `3-D Poisson n=${n}: multigrid PCG, V-cycles, sine transform`,
    run: (ctx) => runW2x3D(ctx, [n]),
  })),
];

function main(): void {
  const args = process.argv.slice(2);
  const child = args.find((x) => x.startsWith('--child='));
  if (child !== undefined) {
    const name = child.slice(8);
    const c = cases.find((k) => k.name === name);
    if (c === undefined) throw new Error(`no case ${name}`);
    c.run({ runs: 5 });
    return;
  }
  const wanted = args.filter((x) => !x.startsWith('--'));
  const chosen = cases.filter((c) => wanted.length === 0 || wanted.some((w) => c.name?.endsWith(`-${w}`) || c.name === w));
  note(`W2 multigrid: node ${process.version}; ${chosen.map((c) => c.name).join(', ')}; one child process each`);
  const script = fileURLToPath(import.meta.url);
  for (const c of chosen) {
    const r = spawnSync(process.execPath, [...process.execArgv, script, `--child=${c.name}`], { stdio: 'inherit' });
    if (r.status !== 0) process.exitCode = 1;
  }
}

if (process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1]) main();
