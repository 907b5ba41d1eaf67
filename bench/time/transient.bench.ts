/**
 * Transient workloads of WORKLOADS.md: W3 (1-D Crank–Nicolson, 10⁶ interior
 * nodes, 100 steps), W4 (2-D Crank–Nicolson, 511² interior, 50 steps to a
 * relative residual of 1e-10) and W5 (2-D leapfrog, 1024² interior, 1000
 * steps). Each figure: set-up (discretisation, factorisation or multigrid
 * hierarchy) excluded from `median_s` and printed as `setup_s`; the error
 * against the closed-form solution; peak RSS.
 *
 * @module
 */
import { grid, solveTransient, solveWave } from '../../src/index.js';
import { type BenchCase, type Timing, median, note, printLine } from '../harness.js';

/**
 * Runs `solve` untimed once, then `runs` times, and returns the timing of
 * the seconds each run reports for its stepping loop (set-up excluded), the
 * median of the whole calls (set-up included), the median over the runs of
 * whole call minus loop (the set-up of one run), and the last result, whose
 * error the caller measures outside the timed calls.
 */
function timeLoops<R extends { readonly seconds: number }>(runs: number, solve: () => R): { timing: Timing; total: number; setup: number; last: R } {
  let last = solve();
  const times: number[] = [];
  const totals: number[] = [];
  const setups: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    last = solve();
    const whole = (performance.now() - t0) / 1000;
    times.push(last.seconds);
    totals.push(whole);
    setups.push(whole - last.seconds);
  }
  return { timing: { runs, median: median(times), min: Math.min(...times), max: Math.max(...times), times }, total: median(totals), setup: median(setups), last };
}

function runW3(): void {
  const n = 1_000_000;
  const g = grid({ x: { from: 0, to: 1, cells: n + 1 } });
  const T = 100 * 1e-5;
  const problem = { grid: g, initial: (x: number) => Math.sin(Math.PI * x), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] } as const;
  const { timing, total, setup, last: r } = timeLoops(5, () => solveTransient(problem, { scheme: 'crank-nicolson', dt: 1e-5, endTime: T }));
  const h = 1 / (n + 1);
  const decay = Math.exp(-(Math.PI ** 2) * T);
  let err = 0;
  for (let i = 0; i <= n + 1; i++) err = Math.max(err, Math.abs(r.field.data[i]! - decay * Math.sin(Math.PI * i * h)));
  printLine({ id: 'W3', impl: 'quadrille', variant: 'cn-thomas', path: 'ts', size: { n, steps: 100 }, timing, figures: { total_s: total, setup_s: setup, max_err: err } });
}

/** The double sine series of u₀ = 16x(1−x)y(1−y) (WORKLOADS.md W4), to 1e-15. */
function w4Exact(x: number, y: number, t: number): number {
  let s = 0;
  for (let m = 1; m < 200; m += 2) {
    for (let k = 1; k < 200; k += 2) {
      const term = (1024 / (m ** 3 * k ** 3 * Math.PI ** 6)) * Math.exp(-(m * m + k * k) * Math.PI ** 2 * t);
      if (term < 1e-18) break;
      s += term * Math.sin(m * Math.PI * x) * Math.sin(k * Math.PI * y);
    }
  }
  return s;
}

function runW4(): void {
  const T = 50 * 1e-4;
  // auto (the sine-transform solver here), multigrid-preconditioned CG for comparison, auto on 500
  // cells (500 = 4·5³: the mixed-radix FFT) beside the 512 of the workload, and auto with the x edges
  // insulated (flux rows in the line systems; no closed form, so no max_err)
  const walls = [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }] as const;
  const insulated = [{ faces: ['ymin', 'ymax'], kind: 'dirichlet', value: 0 }, { faces: ['xmin', 'xmax'], kind: 'neumann', flux: 0 }] as const;
  for (const [variant, solver, cells, boundary] of [
    ['cn-auto', 'auto', 512, walls], ['cn-mg-pcg', 'cg', 512, walls], ['cn-auto-500-cells', 'auto', 500, walls],
    ['cn-auto-insulated-x', 'auto', 512, insulated],
  ] as const) {
    const g = grid({ x: { from: 0, to: 1, cells }, y: { from: 0, to: 1, cells } });
    const problem = { grid: g, initial: (x: number, y: number) => 16 * x * (1 - x) * y * (1 - y), boundary };
    const { timing, total, setup, last: r } = timeLoops(5, () =>
      solveTransient(problem, { scheme: 'crank-nicolson', dt: 1e-4, endTime: T, tolerance: 1e-10, solver }));
    let err = 0;
    if (boundary === walls) {
      for (let i = 0; i <= cells; i += 4) for (let j = 0; j <= cells; j += 4) err = Math.max(err, Math.abs(r.field.get(i, j) - w4Exact(i / cells, j / cells, T)));
    }
    const figures = { total_s: total, setup_s: setup, per_step_s: timing.median / 50, solver: r.solver, iters: r.iterations };
    printLine({
      id: 'W4', impl: 'quadrille', variant, path: 'ts', size: { n: cells - 1, steps: 50 }, timing,
      figures: boundary === walls ? { ...figures, max_err: err } : figures,
    });
  }
}

function runW5(): void {
  const n = 1024;
  const cells = n + 1;
  const h = 1 / cells;
  const g = grid({ x: { from: 0, to: 1, cells }, y: { from: 0, to: 1, cells } });
  const problem = {
    grid: g,
    initial: (x: number, y: number) => Math.sin(Math.PI * x) * Math.sin(Math.PI * y),
    boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 0 }],
  } as const;
  const steps = 1000;
  const T = steps * 0.5 * h;
  const { timing, total, last: r } = timeLoops(5, () => solveWave(problem, { dt: 0.5 * h, endTime: T }));
  const c = Math.cos(Math.SQRT2 * Math.PI * T);
  let err = 0;
  for (let i = 0; i <= cells; i += 4) for (let j = 0; j <= cells; j += 4) err = Math.max(err, Math.abs(r.field.get(i, j) - c * Math.sin(Math.PI * i * h) * Math.sin(Math.PI * j * h)));
  printLine({
    id: 'W5', impl: 'quadrille', variant: 'leapfrog', path: 'ts', size: { n, steps }, timing,
    figures: { total_s: total, s_per_step: timing.median / steps, mpts_per_s: (n * n) / (timing.median / steps) / 1e6, max_err: err },
  });
  note('W3-W5: median_s is the stepping loop (set-up excluded); total_s is the whole call, discretisation and set-up included (the error against the closed form is measured outside the timed calls)');
}

/** The time group's cases. */
export const cases: readonly BenchCase[] = [
  { id: 'W3', group: 'time', title: '1-D Crank–Nicolson, 10⁶ interior nodes, 100 steps (Thomas, factored once)', run: runW3 },
  { id: 'W4', group: 'time', title: '2-D Crank–Nicolson, 511² interior, 50 steps to 1e-10: auto (sine transform), PCG + multigrid, auto on 500 cells, auto with insulated x edges', run: runW4 },
  { id: 'W5', group: 'time', title: '2-D leapfrog, 1024² interior, 1000 steps', run: runW5 },
];
