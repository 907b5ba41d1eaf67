/**
 * Engineering demo: a heated aluminium-alloy mounting plate (invented,
 * illustrative data). One edge sits on a heater bar, the opposite edge loses
 * heat to room air by convection, the other two edges are insulated, and a
 * strip of low-conductivity insert material sits in the middle.
 *
 * 1. steady field: peak temperature, heat balance, solver cost;
 * 2. warm-up from ambient by Crank–Nicolson with a Rannacher start, probes,
 *    time to 95 % of the steady rise (checked on the 1-D slab against the
 *    slowest eigenmode);
 * 3. a tensioned cable by leapfrog: energy drift and the deviation from the
 *    standing-mode closed form;
 * 4. a convergence study of the cable (observed order ≈ 2);
 * 5. plots, HTML report, VTK, CSV written to `outDir`.
 *
 * Run: npx tsx docs/examples/plate.ts [directory]   (default out/)
 */
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import {
  type Grid, type Progress, convergenceStudy, fieldCsv, fieldMap, grid, historyPlot, htmlReport,
  probeCsv, profilePlot, sampleField, solveSteady, solveTransient, solveWave, stringMode, studyPlot, studyTable,
  vtkDocument, writeFileAtomic, writeVtkSeries,
} from '../../src/index.js';

/** The caution printed and put in the report. */
export const PLATE_CAUTION =
  'CAUTION: results are illustrative and must be verified independently; local codes and licensed engineering practice govern design decisions.';

// ---- data (illustrative values, not a material specification) ----
const L = 0.2; // plate length along x (m)
const W = 0.12; // plate height along y (m)
const K_PLATE = 170; // W/(m·K), an aluminium alloy
const K_INSERT = 20; // W/(m·K), the insert strip
const RHO_C = 2.4e6; // J/(m³·K)
const T_HEATER = 120; // °C at x = 0
const H_AIR = 25; // W/(m²·K) at x = L
const T_AIR = 20; // °C
/** The insert: a strip 0.09 ≤ x ≤ 0.11 m, 0.03 ≤ y ≤ 0.09 m. */
const insert = (x: number, y: number): boolean => x >= 0.09 - 1e-12 && x <= 0.11 + 1e-12 && y >= 0.03 - 1e-12 && y <= 0.09 + 1e-12;
const conductivity = (x: number, y: number): number => (insert(x, y) ? K_INSERT : K_PLATE);

const plateBoundary = {
  xmin: { kind: 'dirichlet', value: T_HEATER },
  xmax: { kind: 'robin', h: H_AIR, ambient: T_AIR },
  ymin: { kind: 'neumann', flux: 0 },
  ymax: { kind: 'neumann', flux: 0 },
} as const;

// ---- the cable (illustrative) ----
const CABLE_LENGTH = 1; // m
const CABLE_TENSION = 500; // N
const CABLE_MASS = 0.05; // kg/m
const CABLE_SPEED = Math.sqrt(CABLE_TENSION / CABLE_MASS); // 100 m/s
const CABLE_AMPLITUDE = 0.005; // m
/** 5¼ periods of the fundamental: the mode passes through zero, so the error measures the phase (O(h²)). */
const CABLE_END = (5.25 * 2 * CABLE_LENGTH) / CABLE_SPEED;

/**
 * Slab with a value face at 0 and a convection face at L, in closed form:
 * series resistances L/k and 1/h (Incropera et al., 6th ed., ch. 3).
 * @returns the heat flux q (W/m²) and T(x)
 */
export function slabSteady(x: number): { q: number; T: number } {
  const q = (T_HEATER - T_AIR) / (L / K_PLATE + 1 / H_AIR);
  return { q, T: T_HEATER - (q * x) / K_PLATE };
}

/**
 * Time for the convective face of the uniform slab, warming from T_AIR, to
 * reach 95 % of its steady rise, from the slowest eigenmode
 * θ ∝ sin(λ₁x/L)·exp(−αλ₁²t/L²), λ₁ cos λ₁ + Bi sin λ₁ = 0 (separation of
 * variables; Carslaw & Jaeger 1959, §3.10). Higher modes decay ≥ 9× faster.
 */
export function slabT95Estimate(): number {
  const bi = (H_AIR * L) / K_PLATE;
  const f = (l: number) => l * Math.cos(l) + bi * Math.sin(l);
  let a = Math.PI / 2;
  let b = Math.PI;
  for (let k = 0; k < 200; k++) {
    const m = 0.5 * (a + b);
    if (f(a) * f(m) <= 0) b = m;
    else a = m;
  }
  const lam = 0.5 * (a + b);
  // c₁ = ∫θ₀X₁ / ∫X₁², θ₀(x) = T_ss(x) − T_AIR, by Simpson's rule
  const n = 2000;
  let num = 0;
  let den = 0;
  for (let i = 0; i <= n; i++) {
    const x = (i * L) / n;
    const w = i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2;
    const X = Math.sin((lam * x) / L);
    num += w * (slabSteady(x).T - T_AIR) * X;
    den += w * X * X;
  }
  const c1 = num / den;
  const theta0 = slabSteady(L).T - T_AIR;
  const alpha = K_PLATE / RHO_C;
  return ((L * L) / (alpha * lam * lam)) * Math.log((c1 * Math.sin(lam)) / (0.05 * theta0));
}

/** First time a probe series reaches `target`, linear between records; NaN if never. */
function crossing(times: Float64Array, values: Float64Array, target: number): number {
  for (let i = 1; i < values.length; i++) {
    if (values[i]! >= target) {
      const a = values[i - 1]!;
      const b = values[i]!;
      return times[i - 1]! + ((target - a) / (b - a)) * (times[i]! - times[i - 1]!);
    }
  }
  return Number.NaN;
}

/** A text progress bar, reported every 10 % (and at the end). */
function progressBar(label: string, write: ((line: string) => void) | undefined): ((p: Progress) => void) | undefined {
  if (write === undefined) return undefined;
  let next = 0;
  return (p) => {
    if (p.fraction + 1e-12 < next && p.fraction < 1) return;
    next = Math.floor(p.fraction * 10 + 1e-9) / 10 + 0.1;
    const filled = Math.round(p.fraction * 20);
    write(`${label.padEnd(12)} [${'#'.repeat(filled)}${'.'.repeat(20 - filled)}] ${(p.fraction * 100).toFixed(0).padStart(3)} %  t = ${p.time.toFixed(p.time < 1 ? 4 : 0)} s`);
  };
}

/** Max of a field and where; first node of the max. */
function peakOf(g: Grid, u: Float64Array): { value: number; x: number; y: number } {
  let best = 0;
  for (let r = 1; r < u.length; r++) if (u[r]! > u[best]!) best = r;
  const ny = g.shape[1]!;
  return { value: u[best]!, x: g.axes[0].coordinates[Math.floor(best / ny)]!, y: g.axes[1]!.coordinates[best % ny]! };
}

/** What {@link runPlateDemo} takes. */
export interface PlateDemoOptions {
  /** Where to write the plots, report, VTK and CSV (default: write nothing). */
  readonly outDir?: string;
  /** Coarser grids and steps, for tests. */
  readonly quick?: boolean;
  /** Receives the progress bars and the summary lines. */
  readonly log?: (line: string) => void;
}

/**
 * Runs the plate demo (module doc).
 *
 * @returns plain numbers (°C, W/m, s) and the paths written
 */
export async function runPlateDemo(options: PlateDemoOptions = {}) {
  const t0 = performance.now();
  const quick = options.quick === true;
  const log = options.log;
  const progressOut = options.log === undefined ? undefined : (isMain ? (l: string) => process.stderr.write(`${l}\n`) : log);

  // ---- 1. steady field ----
  const cellsX = quick ? 40 : 100;
  const cellsY = quick ? 24 : 60;
  const plate = grid({ x: { from: 0, to: L, cells: cellsX }, y: { from: 0, to: W, cells: cellsY } });
  const steady = solveSteady({ grid: plate, conductivity, boundary: plateBoundary }, { tolerance: 1e-12 });
  const hb = steady.heatBalance!;
  const flow = (face: string) => hb.faces.find((f) => f.face === face)?.outflow ?? 0;
  const heaterInflow = -flow('xmin'); // W per metre of depth
  const convectiveOutflow = flow('xmax');
  const peak = peakOf(plate, steady.field.data);
  let edgeMax = -Infinity;
  let edgeMin = Infinity;
  for (let j = 0; j <= cellsY; j++) {
    edgeMax = Math.max(edgeMax, steady.field.get(cellsX, j));
    edgeMin = Math.min(edgeMin, steady.field.get(cellsX, j));
  }
  let fieldMin = Infinity;
  for (const v of steady.field.data) fieldMin = Math.min(fieldMin, v);

  // the same plate without the insert is 1-D: the series-resistance closed form
  const uniform = solveSteady({ grid: plate, conductivity: K_PLATE, boundary: plateBoundary }, { tolerance: 1e-12 });
  const exact = sampleField(plate, (x) => slabSteady(x).T);
  let uniformError = 0;
  for (let r = 0; r < plate.size; r++) uniformError = Math.max(uniformError, Math.abs(uniform.field.data[r]! - exact.data[r]!));
  const slab = slabSteady(L);
  const uniformHb = uniform.heatBalance!;
  const uniformFluxError = Math.abs(-uniformHb.faces.find((f) => f.face === 'xmin')!.outflow - slab.q * W) / (slab.q * W);

  // ---- 2. transient warm-up ----
  const endTime = 2400;
  const probes = [[L, W / 2], [L / 2, W / 2]];
  const warm = solveTransient(
    { grid: plate, conductivity, heatCapacity: RHO_C, initial: T_AIR, boundary: plateBoundary },
    {
      scheme: 'crank-nicolson', rannacherSteps: 2, dt: quick ? 20 : 5, endTime, probes,
      outputTimes: [0, 150, 300, 600, 1200, 2400], onProgress: progressBar('warm-up', progressOut),
    },
  );
  const probeSteady = probes.map(([x, y]) => interpolate(plate, steady.field.data, x!, y!));
  const t95 = crossing(warm.times, warm.probes[0]!.values, T_AIR + 0.95 * (probeSteady[0]! - T_AIR));
  const t95Centre = crossing(warm.times, warm.probes[1]!.values, T_AIR + 0.95 * (probeSteady[1]! - T_AIR));

  // the uniform slab in 1-D against its slowest mode
  const line = grid({ x: { from: 0, to: L, cells: quick ? 50 : 100 } });
  const slabRun = solveTransient(
    { grid: line, conductivity: K_PLATE, heatCapacity: RHO_C, initial: T_AIR, boundary: { xmin: plateBoundary.xmin, xmax: plateBoundary.xmax } },
    { scheme: 'crank-nicolson', rannacherSteps: 2, dt: quick ? 2 : 1, endTime, probes: [[L]] },
  );
  const slabSs = solveSteady({ grid: line, conductivity: K_PLATE, boundary: { xmin: plateBoundary.xmin, xmax: plateBoundary.xmax } }).field.get(line.nx - 1);
  const t95Slab = crossing(slabRun.times, slabRun.probes[0]!.values, T_AIR + 0.95 * (slabSs - T_AIR));
  const t95Estimate = slabT95Estimate();

  // ---- 3. the cable by leapfrog ----
  const cableCells = quick ? 100 : 200;
  const cable = grid({ x: { from: 0, to: CABLE_LENGTH, cells: cableCells } });
  const mode = (x: number, t: number) => CABLE_AMPLITUDE * stringMode(x, t, 1, { length: CABLE_LENGTH, speed: CABLE_SPEED });
  const xs = cable.axes[0].coordinates;
  let cableDeviation = 0;
  const wave = solveWave(
    { grid: cable, waveSpeed: CABLE_SPEED, initial: (x) => mode(x, 0), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] },
    {
      dt: stepFor(CABLE_LENGTH / cableCells), endTime: CABLE_END, recordEnergy: true,
      probes: [[CABLE_LENGTH / 2]], onProgress: progressBar('cable', progressOut),
      onStep: ({ time, u }) => {
        for (let i = 0; i < u.length; i++) cableDeviation = Math.max(cableDeviation, Math.abs(u[i]! - mode(xs[i]!, time)));
      },
    },
  );
  const e0 = wave.energy[0]!;
  let energyDrift = 0;
  for (const e of wave.energy) energyDrift = Math.max(energyDrift, Math.abs(e - e0) / e0);

  // ---- 4. convergence of the cable standing mode, h and dt together ----
  const cellsList = quick ? [20, 40, 80, 160] : [40, 80, 160, 320];
  const study = convergenceStudy(({ spacing }) => {
    const n = Math.round(CABLE_LENGTH / spacing!);
    const g = grid({ x: { from: 0, to: CABLE_LENGTH, cells: n } });
    const r = solveWave(
      { grid: g, waveSpeed: CABLE_SPEED, initial: (x) => mode(x, 0), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] },
      { dt: stepFor(spacing!), endTime: CABLE_END },
    );
    return { grid: g, computed: r.field, exact: (x: number) => mode(x, r.time) };
  }, { refine: 'both', spacings: cellsList.map((n) => CABLE_LENGTH / n), timeStep: stepFor });
  const orders = { l2: study.fits.l2!.order, linf: study.fits.linf!.order };
  const lastPair = study.pairs[study.pairs.length - 1]!.orders;

  // ---- 5. summary ----
  const imbalance = (heaterInflow - convectiveOutflow) / heaterInflow;
  const seconds = (performance.now() - t0) / 1000;
  const summary = [
    `quadrille plate demo${quick ? ' (quick grids)' : ''}: ${L} m × ${W} m plate, k = ${K_PLATE} W/(m·K) with a k = ${K_INSERT} insert, heater ${T_HEATER} °C, air ${T_AIR} °C at h = ${H_AIR} W/(m²·K)`,
    `steady (${plate.shape.join(' × ')} nodes): peak ${peak.value.toFixed(2)} °C at (x, y) = (${peak.x.toFixed(3)}, ${peak.y.toFixed(3)}) m (heater edge); minimum ${fieldMin.toFixed(2)} °C; convective edge ${edgeMin.toFixed(2)} … ${edgeMax.toFixed(2)} °C`,
    `heat balance: heater in ${heaterInflow.toFixed(3)} W/m, convection out ${convectiveOutflow.toFixed(3)} W/m, relative imbalance ${hb.relative.toExponential(2)}`,
    `solver ${steady.solver}: ${steady.iterations} iterations, residual ${steady.residual.toExponential(1)}, ${(steady.seconds.total * 1000).toFixed(0)} ms`,
    `no-insert check: max |T − T_slab| = ${uniformError.toExponential(2)} K (closed form T(L) = ${slab.T.toFixed(3)} °C, q = ${slab.q.toFixed(1)} W/m²)`,
    `warm-up (CN + Rannacher, ${warm.steps} steps of ${warm.dt} s, ${warm.iterations} CG iterations, ${(warm.seconds * 1000).toFixed(0)} ms): t95 at the convective-edge midpoint ${t95.toFixed(0)} s (${(t95 / 60).toFixed(1)} min), at the centre ${t95Centre.toFixed(0)} s`,
    `uniform slab t95: computed ${t95Slab.toFixed(1)} s, slowest-mode estimate ${t95Estimate.toFixed(1)} s`,
    `cable (c = ${CABLE_SPEED.toFixed(0)} m/s, ${cableCells} cells, ${wave.steps} leapfrog steps): energy drift ${energyDrift.toExponential(2)}, max |u − standing mode| ${(cableDeviation * 1000).toFixed(4)} mm (${((cableDeviation / CABLE_AMPLITUDE) * 100).toFixed(3)} % of the amplitude)`,
    `convergence (cable, h and dt together): observed orders l2 ${orders.l2.toFixed(3)}, linf ${orders.linf.toFixed(3)} (last pair ${lastPair.linf!.toFixed(3)})`,
    PLATE_CAUTION,
  ];

  // ---- outputs ----
  const files: string[] = [];
  if (options.outDir !== undefined) {
    const dir = options.outDir;
    const put = async (name: string, text: string) => {
      const path = join(dir, name);
      await writeFileAtomic(path, text, { createDirectories: true });
      files.push(path);
    };
    const T = [{ name: 'T', unit: '°C', field: steady.field }];
    const map = fieldMap(plate, steady.field, {
      quantity: 'temperature', units: '°C', levels: isotherms(edgeMin, T_HEATER),
      title: 'Steady plate temperature with isotherms (insert in the middle)',
    });
    const profile = profilePlot(plate, [
      { label: 'with insert', field: steady.field },
      { label: 'no insert', field: uniform.field, style: 'points' },
      { label: 'slab closed form', field: exact },
    ], { along: 'x', at: W / 2, quantity: 'temperature', units: '°C' });
    const history = historyPlot(warm, { quantity: 'temperature', units: '°C', timeUnit: 'min', labels: ['convective edge midpoint', 'centre'] });
    const convergence = studyPlot(study, { title: 'Cable standing mode: observed convergence', slopes: [2] });
    await put('plate-steady.svg', map);
    await put('plate-profile.svg', profile);
    await put('plate-probes.svg', history);
    await put('plate-convergence.svg', convergence);
    const vtk = vtkDocument(plate, T);
    await put(`plate-steady${vtk.extension}`, vtk.text);
    const series = await writeVtkSeries(dir, 'plate-warmup', plate, warm.outputs, { name: 'T', unit: '°C', createDirectories: true });
    files.push(...series.files, series.collection);
    await put('plate-steady.csv', fieldCsv(plate, T));
    await put('plate-probes.csv', probeCsv(warm, { names: ['T_edge_mid', 'T_centre'], unit: '°C' }));
    const rows: (string | number)[][] = [
      ['peak temperature', `${peak.value.toFixed(2)} °C at (${peak.x.toFixed(3)}, ${peak.y.toFixed(3)}) m`],
      ['convective edge', `${edgeMin.toFixed(2)} … ${edgeMax.toFixed(2)} °C`],
      ['heater inflow', `${heaterInflow.toFixed(3)} W/m`],
      ['convective outflow', `${convectiveOutflow.toFixed(3)} W/m`],
      ['relative imbalance', hb.relative.toExponential(2)],
      ['steady solver', `${steady.solver}, ${steady.iterations} iterations, ${(steady.seconds.total * 1000).toFixed(0)} ms`],
      ['t95, convective edge midpoint', `${t95.toFixed(0)} s`],
      ['t95, centre', `${t95Centre.toFixed(0)} s`],
      ['t95 slab: computed / slowest mode', `${t95Slab.toFixed(1)} s / ${t95Estimate.toFixed(1)} s`],
      ['cable energy drift', energyDrift.toExponential(2)],
      ['cable max deviation', `${(cableDeviation * 1000).toFixed(4)} mm`],
      ['observed order (l2, linf)', `${orders.l2.toFixed(3)}, ${orders.linf.toFixed(3)}`],
    ];
    await put('plate-report.html', htmlReport({
      title: 'Heated mounting plate — quadrille demo',
      summary: 'Steady field, warm-up, a tensioned cable and a convergence study (invented, illustrative data).',
      caution: PLATE_CAUTION,
      sections: [
        { heading: 'Summary', blocks: [{ kind: 'table', header: ['quantity', 'value'], rows }] },
        { heading: 'Steady field', blocks: [
          { kind: 'figure', svg: map, caption: 'Heater bar at x = 0, convection at x = L, insulated top and bottom; the insert is the strip in the middle.' },
          { kind: 'figure', svg: profile, caption: 'Profile at mid-height; without the insert the field is linear (series resistances L/k and 1/h, Incropera et al., 6th ed., ch. 3).' },
        ] },
        { heading: 'Warm-up', blocks: [{ kind: 'figure', svg: history, caption: 'Crank–Nicolson with two Rannacher start-up steps from 20 °C.' }] },
        { heading: 'Convergence', blocks: [{ kind: 'figure', svg: convergence }, { kind: 'markdown', text: studyTable(study) }] },
      ],
    }));
  }

  if (log) for (const l of summary) log(l);
  return {
    nodes: plate.size,
    peakTemperature: peak.value,
    peakX: peak.x,
    peakY: peak.y,
    minTemperature: fieldMin,
    convectiveEdgeMin: edgeMin,
    convectiveEdgeMax: edgeMax,
    heaterInflow,
    convectiveOutflow,
    imbalance,
    relativeImbalance: hb.relative,
    solver: steady.solver,
    solverIterations: steady.iterations,
    solverSeconds: steady.seconds.total,
    uniformMaxError: uniformError,
    uniformFluxError,
    uniformRelativeImbalance: uniformHb.relative,
    slabEdgeTemperature: slab.T,
    t95,
    t95Centre,
    t95Slab,
    t95Estimate,
    transientSteps: warm.steps,
    transientIterations: warm.iterations,
    transientSeconds: warm.seconds,
    cableSteps: wave.steps,
    energyDrift,
    cableDeviation,
    cableAmplitude: CABLE_AMPLITUDE,
    orderL2: orders.l2,
    orderLinf: orders.linf,
    heaterTemperature: T_HEATER,
    ambientTemperature: T_AIR,
    seconds: (performance.now() - t0) / 1000,
    summary,
    files,
  };
}

/** Leapfrog step at Courant number ½, adjusted so the end time is a whole number of steps. */
function stepFor(h: number): number {
  const n = Math.round(CABLE_END / ((0.5 * h) / CABLE_SPEED));
  return (CABLE_END / n) * (1 + 1e-12);
}

/** Isotherms at a round spacing (0.1, 0.2, 0.25, 0.5, 1, 2, 5, 10 K …) between the coolest edge value and the heater, at most 12. */
function isotherms(lo: number, hi: number): number[] {
  const steps = [0.1, 0.2, 0.25, 0.5, 1, 2, 5, 10, 20, 50];
  const step = steps.find((s) => (hi - lo) / s <= 12) ?? 100;
  const out: number[] = [];
  for (let k = Math.floor(lo / step) + 1; k * step < hi - 1e-9; k++) out.push(Number((k * step).toFixed(6)));
  return out;
}

/** Bilinear value of a nodal field on a uniform 2-D grid. */
function interpolate(g: Grid, u: Float64Array, x: number, y: number): number {
  const [nx, ny] = [g.shape[0]!, g.shape[1]!];
  const fx = Math.min(Math.max((x / L) * (nx - 1), 0), nx - 1);
  const fy = Math.min(Math.max((y / W) * (ny - 1), 0), ny - 1);
  const i = Math.min(Math.floor(fx), nx - 2);
  const j = Math.min(Math.floor(fy), ny - 2);
  const a = fx - i;
  const b = fy - j;
  const v = (p: number, q: number) => u[(i + p) * ny + (j + q)]!;
  return (1 - a) * (1 - b) * v(0, 0) + a * (1 - b) * v(1, 0) + (1 - a) * b * v(0, 1) + a * b * v(1, 1);
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;

if (isMain) {
  const outDir = process.argv[2] ?? 'out';
  runPlateDemo({ outDir, log: (l) => console.log(l) }).then((r) => {
    console.log(`wrote ${r.files.length} files to ${outDir}/ in ${r.seconds.toFixed(1)} s`);
  });
}
