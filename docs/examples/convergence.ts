/**
 * A convergence study as a user's test suite would write it: the plate with
 * one edge at 100 °C and three at 0 °C, the temperature at (0.5, 0.75)
 * against the Fourier series, on four grids. Run: npx tsx docs/examples/convergence.ts
 */
import { pathToFileURL } from 'node:url';
import { convergenceStudy, grid, plateWithHeatedEdge, solveSteady, studyTable } from '../../src/index.js';
import { expectOrder } from '../../src/testing.js';

const boundary = [
  { faces: ['xmin', 'xmax', 'ymin'], kind: 'dirichlet', value: 0 },
  { faces: 'ymax', kind: 'dirichlet', value: 100 },
] as const;

/** Runs the study and asserts second order; returns it for printing. */
export function plateStudy() {
  const study = convergenceStudy(({ spacing }) => {
    const n = Math.round(1 / spacing!);
    const plate = grid({ x: { from: 0, to: 1, cells: n }, y: { from: 0, to: 1, cells: n } });
    const T = solveSteady({ grid: plate, boundary }).field.get(n / 2, (3 * n) / 4);
    return { quantity: Math.abs(T - 100 * plateWithHeatedEdge(0.5, 0.75)) };
  }, { refine: 'space', spacings: [1 / 16, 1 / 32, 1 / 64, 1 / 128] });
  expectOrder(study, 2, { norm: 'quantity' });
  return study;
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  console.log(studyTable(plateStudy()));
}
