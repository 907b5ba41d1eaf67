/**
 * The plots guide's example: a steady plate on a stretched grid as a field
 * map with isotherms and a profile against the closed form, a wall's
 * warm-up as probe histories, a convergence study as a log–log plot, and
 * all of it in one self-contained HTML report (invented data).
 * Run: npx tsx docs/examples/plots.ts [report.html]
 */
import { writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import {
  convergenceStudy, fieldMap, grid, historyPlot, htmlReport, plateWithHeatedEdge, profilePlot,
  sampleField, solveSteady, solveTransient, studyPlot, studyTable, tanhAxis,
} from '../../src/index.js';

/** Builds the four plots and the report; returns them with the numbers the guide quotes. */
export function plotsExample() {
  // a 0.2 m × 0.1 m plate, 100 °C on the top edge, 20 °C on the others; cells finer towards the hot edge
  const a = 0.2;
  const b = 0.1;
  const plate = grid({ x: { from: 0, to: a, cells: 32 }, y: tanhAxis({ from: 0, to: b, cells: 24, beta: 1.5, cluster: 'to' }) });
  const boundary = [
    { faces: ['xmin', 'xmax', 'ymin'], kind: 'dirichlet', value: 20 },
    { faces: 'ymax', kind: 'dirichlet', value: 100 },
  ] as const;
  const T = solveSteady({ grid: plate, boundary }).field;
  // the closed form on the nodes; the top edge itself is 100 °C (the series is not summed there)
  const exact = sampleField(plate, (x, y) => (y === b ? 100 : 20 + 80 * plateWithHeatedEdge(x, y, a, b)));
  const map = fieldMap(plate, T, { quantity: 'temperature', units: '°C', levels: [30, 40, 50, 60, 70, 80, 90], title: 'Plate with a heated edge' });
  const profile = profilePlot(plate, [{ label: 'computed', field: T, style: 'points' }, { label: 'Fourier series', field: exact }], {
    along: 'y', at: a / 2, quantity: 'temperature', units: '°C',
  });

  // a 200 mm concrete wall warming from one face for two hours, probes at 25, 50 and 100 mm
  const wall = grid({ x: { from: 0, to: 0.2, cells: 40 } });
  const run = solveTransient(
    {
      grid: wall, conductivity: 1.4, heatCapacity: 1.9e6, initial: 20,
      boundary: { xmin: { kind: 'dirichlet', value: 120 }, xmax: { kind: 'robin', h: 12, ambient: 20 } },
    },
    { scheme: 'crank-nicolson', dt: 60, endTime: 7200, rannacherSteps: 2, probes: [[0.025], [0.05], [0.1]] },
  );
  const history = historyPlot(run, { quantity: 'temperature', units: '°C', timeUnit: 'h' });

  // second-order convergence of −u'' = π² sin πx on four grids
  const study = convergenceStudy(({ spacing }) => {
    const n = Math.round(1 / spacing!);
    const line = grid({ x: { from: 0, to: 1, cells: n } });
    const u = solveSteady({ grid: line, source: (x: number) => Math.PI ** 2 * Math.sin(Math.PI * x), boundary: [{ faces: ['xmin', 'xmax'], kind: 'dirichlet', value: 0 }] }).field;
    let e = 0;
    for (let i = 0; i <= n; i++) e = Math.max(e, Math.abs(u.get(i) - Math.sin((Math.PI * i) / n)));
    return { linf: e };
  }, { refine: 'space', spacings: [1 / 8, 1 / 16, 1 / 32, 1 / 64] });
  const convergence = studyPlot(study, { slopes: [1, 2] });

  const html = htmlReport({
    title: 'Plate and wall — plots',
    summary: 'Steady plate on a stretched grid, a wall warming up, and the order of accuracy.',
    caution: 'Illustrative numbers from invented data. Check results independently; local codes and licensed engineering practice govern design.',
    sections: [
      { heading: 'Plate', blocks: [
        { kind: 'figure', svg: map, caption: 'Temperature with isotherms every 10 °C; the cells shrink towards the hot edge.' },
        { kind: 'figure', svg: profile, caption: 'Vertical profile through the middle against the Fourier series (Carslaw & Jaeger 1959, §5.2).' },
      ] },
      { heading: 'Wall', blocks: [{ kind: 'figure', svg: history }] },
      { heading: 'Convergence', blocks: [{ kind: 'figure', svg: convergence }, { kind: 'markdown', text: studyTable(study) }] },
    ],
  });

  // along the profile line x = a/2 (node 16), below the hot edge: far from the corners, where
  // the two edge temperatures meet and the error is largest
  let worst = 0;
  for (let j = 0; j < plate.ny! - 1; j++) worst = Math.max(worst, Math.abs(T.get(16, j) - exact.get(16, j)));
  const mid = run.probes[2]!.values;
  return {
    map, profile, history, convergence, html,
    isotherms: (map.match(/class="contour"/g) ?? []).length,
    plateError: worst,
    wallMidAfter2h: mid[mid.length - 1]!,
    order: study.fits.linf!.order,
  };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = plotsExample();
  const out = process.argv[2] ?? 'quadrille-plots.html';
  writeFileSync(out, r.html);
  console.log(`${r.isotherms} isotherms; plate max |T − series| = ${r.plateError.toFixed(3)} K; wall mid after 2 h ${r.wallMidAfter2h.toFixed(2)} °C; order ${r.order.toFixed(2)}`);
  console.log(`report: ${out} (${(r.html.length / 1024).toFixed(0)} kB)`);
  console.log('CAUTION: illustrative numbers; verify independently, local codes and licensed practice govern design.');
}
