import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeOutputs } from '../../docs/examples/outputs.js';

describe('docs/examples/outputs.ts runs and prints true numbers', () => {
  it('writes every file, and each reads back to the same bits', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'quadrille-example-'));
    try {
      const r = await writeOutputs(join(dir, 'out'));
      expect(r.csvRows).toBe(101 * 7);
      expect(r.dataset).toBe('RectilinearGrid');
      expect(r.matrixRows).toBe(101 * 7);
      // the steady system is exactly symmetric at accuracy 2, so only its lower triangle is written
      expect(r.matrixBanner).toBe('%%MatrixMarket matrix coordinate real symmetric');
      expect([r.csvExact, r.matrixExact, r.rhsExact]).toEqual([true, true, true]);
      expect(r.seriesFiles).toBe(5);
      // maximum principle: steady values lie between the edge temperatures; then the plate cools towards 20 °C
      expect(r.probeStart).toBeGreaterThan(20);
      expect(r.probeStart).toBeLessThan(100);
      expect(r.probeEnd).toBeGreaterThan(20);
      expect(r.probeEnd).toBeLessThan(r.probeStart);
      expect(readdirSync(join(dir, 'out')).sort()).toEqual([
        'cooling.json', 'cooling.pvd', 'cooling_0000.vtr', 'cooling_0001.vtr', 'cooling_0002.vtr', 'cooling_0003.vtr',
        'cooling_0004.vtr', 'plate-rhs.mtx', 'plate-system.mtx', 'plate.csv', 'plate.vtr',
      ]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
