/**
 * Writing results to files: a heated plate (invented data) solved steady,
 * its temperature as CSV and VTK, its linear system in Matrix Market for an
 * outside solver, and a short cool-down as a VTK time series that ParaView
 * opens as one item. Every file is written atomically.
 * Run: npx tsx docs/examples/outputs.ts [directory]
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import {
  fieldCsv, grid, matrixFromMatrixMarket, matrixToMatrixMarket, readFieldCsv, runResultJson, solveSteady,
  solveTransient, vectorFromMatrixMarket, vectorToMatrixMarket, vtkDocument, writeFileAtomic, writeVtkSeries,
} from '../../src/index.js';

const boundary = [
  { faces: ['xmin', 'xmax', 'ymin'], kind: 'dirichlet', value: 20 },
  { faces: 'ymax', kind: 'dirichlet', value: 100 },
] as const;

/** Writes the outputs into `directory`; returns what was written and the round-trip checks. */
export async function writeOutputs(directory: string) {
  // 0.4 m × 0.2 m plate, 4 mm cells in x, cells clustered towards the hot edge in y
  const plate = grid({ x: { from: 0, to: 0.4, cells: 100 }, y: { nodes: [0, 0.05, 0.1, 0.14, 0.17, 0.19, 0.2] } });
  const steady = solveSteady({ grid: plate, conductivity: 45, boundary });
  const T = steady.field;

  const csv = fieldCsv(plate, [{ name: 'T', unit: '°C', field: T }]);
  await writeFileAtomic(join(directory, 'plate.csv'), csv, { createDirectories: true });
  const vtk = vtkDocument(plate, [{ name: 'T', unit: '°C', field: T }]);
  await writeFileAtomic(join(directory, `plate${vtk.extension}`), vtk.text);

  const system = steady.discretization.system();
  await writeFileAtomic(join(directory, 'plate-system.mtx'), matrixToMatrixMarket(system.matrix, { comments: ['steady plate, unknowns x slowest'] }));
  await writeFileAtomic(join(directory, 'plate-rhs.mtx'), vectorToMatrixMarket(system.rhs));

  // read everything back: the values must be the same bits
  const table = readFieldCsv(readFileSync(join(directory, 'plate.csv'), 'utf8'));
  const csvExact = table.fields[0]!.field.data.every((v, i) => Object.is(v, T.data[i]));
  const a = matrixFromMatrixMarket(readFileSync(join(directory, 'plate-system.mtx'), 'utf8'));
  const m = system.matrix.matrix;
  const matrixExact = a.values.length === m.values.length && a.values.every((v, p) => Object.is(v, m.values[p]) && a.colIdx[p] === m.colIdx[p]);
  const b = vectorFromMatrixMarket(readFileSync(join(directory, 'plate-rhs.mtx'), 'utf8'));
  const rhsExact = b.every((v, i) => Object.is(v, system.rhs[i]));

  // the plate cools after the hot edge is switched off: five snapshots in one .pvd
  const run = solveTransient(
    { grid: plate, conductivity: 45, heatCapacity: 3.6e6, initial: T, boundary: [{ faces: ['xmin', 'xmax', 'ymin', 'ymax'], kind: 'dirichlet', value: 20 }] },
    { scheme: 'backward-euler', dt: 30, endTime: 600, outputTimes: [0, 150, 300, 450, 600], probes: [[0.2, 0.17]] },
  );
  const series = await writeVtkSeries(directory, 'cooling', plate, run.outputs, { name: 'T', unit: '°C' });
  await writeFileAtomic(join(directory, 'cooling.json'), runResultJson(run, { outputFiles: series.files.map((f) => f.slice(directory.length + 1)) }));

  return {
    csvRows: csv.trimEnd().split('\n').length - 1,
    dataset: vtk.dataset,
    matrixRows: m.rows,
    matrixBanner: readFileSync(join(directory, 'plate-system.mtx'), 'utf8').split('\n')[0]!,
    csvExact,
    matrixExact,
    rhsExact,
    seriesFiles: series.files.length,
    probeStart: run.probes[0]!.values[0]!,
    probeEnd: run.probes[0]!.values[run.probes[0]!.values.length - 1]!,
  };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const dir = process.argv[2] ?? mkdtempSync(join(tmpdir(), 'quadrille-outputs-'));
  writeOutputs(dir).then((r) => {
    console.log(`wrote ${dir}:`);
    console.log(`  plate.csv: ${r.csvRows} rows, read back exactly: ${r.csvExact}`);
    console.log(`  plate.vtr (${r.dataset}), cooling.pvd with ${r.seriesFiles} snapshots, cooling.json`);
    console.log(`  plate-system.mtx: ${r.matrixBanner}, ${r.matrixRows} rows, exact: ${r.matrixExact}; rhs exact: ${r.rhsExact}`);
    console.log(`  probe at (0.2, 0.17): ${r.probeStart.toFixed(2)} °C → ${r.probeEnd.toFixed(2)} °C after 10 min`);
    console.log('CAUTION: illustrative numbers; verify independently, local codes and licensed practice govern design.');
  });
}
