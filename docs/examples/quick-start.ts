/**
 * The README's example: the exact fourth-order second-derivative stencil and
 * its use on samples of a temperature profile. Run: npx tsx docs/examples/quick-start.ts
 */
import { pathToFileURL } from 'node:url';
import { applyStencil, centralStencil, fornbergWeights } from '../../src/index.js';

/** Returns what the README prints, so a test can check it. */
export function quickStart(): { weights: string[]; leadingError: string; curvature: number; biased: number[] } {
  const st = centralStencil(2, 4); // d²/dx², error O(dx⁴)
  const dx = 0.01; // m
  const T = Float64Array.from({ length: 11 }, (_, i) => 20 + 300 * (i * dx) ** 2); // °C
  const d2 = applyStencil(st, T, dx); // K/m² at nodes 2 … 8
  const biased = Array.from(fornbergWeights(1, [-1, 0, 2])); // d/dx at 0 from uneven nodes
  return { weights: st.exact.map(String), leadingError: st.leadingError.toString(), curvature: d2[5]!, biased };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = quickStart();
  console.log(r.weights.join(' '), '| C =', r.leadingError, '| T″ =', r.curvature.toFixed(6), '| biased:', r.biased);
}
