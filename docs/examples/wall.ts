/**
 * The README's transient example: a 200 mm concrete wall (invented data)
 * whose inner face jumps to 120 °C while the outer face loses heat to 20 °C
 * air; Crank–Nicolson with a Rannacher start, eight hours, a probe mid-wall.
 * Run: npx tsx docs/examples/wall.ts
 */
import { pathToFileURL } from 'node:url';
import { grid, solveTransient } from '../../src/index.js';

/** Runs the example; returns the run. */
export function wallWarmUp() {
  const wall = grid({ x: { from: 0, to: 0.2, cells: 40 } });
  return solveTransient(
    {
      grid: wall, conductivity: 1.4, heatCapacity: 1.9e6, initial: 20,
      boundary: { xmin: { kind: 'dirichlet', value: 120 }, xmax: { kind: 'robin', h: 12, ambient: 20 } },
    },
    { scheme: 'crank-nicolson', dt: 60, endTime: 3600 * 8, rannacherSteps: 2, probes: [[0.1]] },
  );
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = wallWarmUp();
  const p = r.probes[0]!.values;
  console.log(`mid-wall after 8 h: ${p[p.length - 1]!.toFixed(2)} °C (${r.steps} steps of ${r.dt} s)`);
  console.log('CAUTION: illustrative numbers; verify independently, local codes and licensed practice govern design.');
}
