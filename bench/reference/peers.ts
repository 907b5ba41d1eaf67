/**
 * Optional reference runners: the C and numpy/scipy peers of the workloads,
 * run beside quadrille so that ratios come from one session. They run only
 * when their tools exist (gcc for C; python3 with numpy and scipy for the
 * Python peers); the library and its tests never depend on them.
 *
 * The peers live in `../shared/peers` next to the repository (override with
 * `QUADRILLE_PEERS=/path/to/peers`). Their lines put the implementation as
 * the second word (`W1 c-O3 n=2048 …`); this module reprints them in the
 * harness format (`W1 impl=c variant=O3 n=2048 …`). Registered in
 * {@link peerSources}: W1 and W1b (`c/stencil.c`, compiled to a temporary
 * directory and removed afterwards, and `w1_stencil.py`), the W2 CSR
 * assembly (`w2_poisson.py`'s `assemble`; its solves take minutes, run the
 * script by hand), W3 (`c/heat1d.c`, `w3_heat1d.py`), W4 (`w4_heat2d.py`)
 * and W5 (`c/wave.c`, `w5_wave.py`). The W4 peer steps 512² interior nodes
 * from sin·sin, quadrille 511² (512 cells) from the polynomial start of
 * WORKLOADS.md; a factor-once LU costs the same for either start.
 *
 * Run alone: `npx tsx bench/reference/peers.ts [W1] [W1b] [W2] [W3] [W4] [W5]`.
 *
 * @module
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** One figure of a peer, parsed. */
export interface PeerLine {
  /** Workload id (W1, W1b). */
  readonly id: string;
  /** c, numpy or scipy. */
  readonly impl: string;
  /** The rest of the peer's implementation name (O3, slice-blocked, csr, …). */
  readonly variant: string;
  /** Its key=value fields in order (n, runs, median_s, …). */
  readonly fields: ReadonlyMap<string, string>;
}

const here = dirname(fileURLToPath(import.meta.url));

/** Where the peers are: $QUADRILLE_PEERS, else ../shared/peers beside the repository. */
export function peersDir(): string {
  return process.env.QUADRILLE_PEERS ?? resolve(here, '..', '..', '..', 'shared', 'peers');
}

function works(cmd: string, args: readonly string[]): boolean {
  const r = spawnSync(cmd, args, { stdio: 'ignore' });
  return r.status === 0;
}

/** Which peers can run here, and why not where not. */
export function availability(): { c: boolean; python: boolean; why: string[] } {
  const dir = peersDir();
  const why: string[] = [];
  const have = existsSync(join(dir, 'c', 'stencil.c'));
  if (!have) why.push(`no peers at ${dir}`);
  const c = have && works('gcc', ['--version']);
  if (have && !c) why.push('gcc not found: C peer skipped');
  const python = have && works('python3', ['-c', 'import numpy, scipy']);
  if (have && !python) why.push('python3 with numpy and scipy not found: numpy/scipy peers skipped');
  return { c, python, why };
}

/** Parses one peer output line; undefined for lines that are not figures. */
export function parsePeerLine(line: string): PeerLine | undefined {
  const words = line.trim().split(/\s+/);
  if (words.length < 3 || !/^W\d/.test(words[0])) return undefined;
  const name = words[1];
  const dash = name.indexOf('-');
  const impl = dash < 0 ? name : name.slice(0, dash);
  if (impl !== 'c' && impl !== 'numpy' && impl !== 'scipy') return undefined;
  const fields = new Map<string, string>();
  for (const w of words.slice(2)) {
    const eq = w.indexOf('=');
    if (eq > 0) fields.set(w.slice(0, eq), w.slice(eq + 1));
  }
  if (!fields.has('median_s')) return undefined;
  return { id: words[0], impl, variant: dash < 0 ? 'default' : name.slice(dash + 1), fields };
}

/** A peer figure in the harness line format: size keys, timings, then the rest. */
export function formatPeerLine(p: Readonly<PeerLine>): string {
  const parts = [p.id, `impl=${p.impl}`, `variant=${p.variant}`];
  const first = ['n', 'median_s', 'min_s', 'max_s', 'runs'];
  for (const k of first) {
    const v = p.fields.get(k);
    if (v !== undefined) parts.push(`${k}=${v}`);
  }
  for (const [k, v] of p.fields) if (!first.includes(k)) parts.push(`${k}=${v}`);
  return parts.join(' ');
}

function emit(text: string, wanted: ReadonlySet<string> | undefined, out: PeerLine[]): void {
  for (const line of text.split('\n')) {
    if (line.trim() === '') continue;
    const p = parsePeerLine(line);
    if (p) {
      if (wanted && !wanted.has(p.id.toLowerCase())) continue;
      out.push(p);
      process.stdout.write(`${formatPeerLine(p)}\n`);
    } else {
      process.stdout.write(`# peer: ${line}\n`);
    }
  }
}

/** One peer program: the workloads it prints, what it needs, how to run it. */
export interface PeerSource {
  /** Lower-case ids of the workloads whose lines it prints. */
  readonly ids: readonly string[];
  /** The tool it needs. */
  readonly needs: 'c' | 'python';
  /** What runs, for the `# peers:` note. */
  readonly label: string;
  /** Runs it in `dir` (the peers folder) and returns its stdout. */
  readonly run: (dir: string) => string;
}

/** Compiles `c/<name>.c` into a temporary directory (removed afterwards) and runs it. */
function runC(dir: string, name: string, args: readonly string[]): string {
  const bin = mkdtempSync(join(tmpdir(), 'quadrille-peers-'));
  try {
    const exe = join(bin, name);
    const cc = spawnSync('gcc', ['-O3', '-march=native', '-std=c11', '-Wall', '-Wextra',
      '-o', exe, join(dir, 'c', `${name}.c`), '-lm'], { encoding: 'utf8' });
    if (cc.status !== 0) return `gcc failed: ${(cc.stderr ?? '').split('\n')[0]}\n`;
    const r = spawnSync(exe, args, { encoding: 'utf8', env: { ...process.env, OMP_NUM_THREADS: '1' } });
    return r.stdout ?? '';
  } finally {
    rmSync(bin, { recursive: true, force: true });
  }
}

function runPython(dir: string, args: readonly string[]): string {
  const r = spawnSync('python3', args, { cwd: dir, encoding: 'utf8', maxBuffer: 1 << 24 });
  const tail = r.status === 0 ? '' : `python3 ${args[0]} exited with ${r.status}: ${(r.stderr ?? '').trim().split('\n').pop() ?? ''}\n`;
  return (r.stdout ?? '') + tail;
}

// W2 assembly only (w2_poisson.py as a whole also runs the minutes-long
// solves): its own `assemble` (kron(I,T) + kron(T,I), scaled, to CSC as the
// peer reports it, and to CSR, the format quadrille builds) at n = 1024.
const W2_ASSEMBLY = [
  'import common',
  'from common import report, timeit',
  'import w2_poisson as w',
  'for fmt in ("csc", "csr"):',
  '    t, A = timeit(lambda: w.assemble(1024, fmt), 5)',
  '    report("W2", "scipy-assembly-kron-" + fmt, t, {"n": 1024}, nnz=A.nnz)',
  '    del A',
].join('\n');

/**
 * The peers, in run order. To add one, list it here with the ids it prints;
 * {@link runPeers} runs those whose ids were asked for.
 */
export const peerSources: readonly PeerSource[] = [
  { ids: ['w1', 'w1b'], needs: 'c', label: 'c/stencil.c 2048, gcc -O3 -march=native -std=c11',
    run: (dir) => runC(dir, 'stencil', ['2048']) },
  { ids: ['w1', 'w1b'], needs: 'python', label: 'python3 w1_stencil.py',
    run: (dir) => runPython(dir, ['w1_stencil.py']) },
  { ids: ['w2'], needs: 'python', label: 'python3: w2_poisson.assemble(1024), CSC and CSR',
    run: (dir) => runPython(dir, ['-c', W2_ASSEMBLY]) },
  { ids: ['w3'], needs: 'c', label: 'c/heat1d.c 1000000 100, gcc -O3 -march=native -std=c11',
    run: (dir) => runC(dir, 'heat1d', ['1000000', '100']) },
  { ids: ['w3'], needs: 'python', label: 'python3 w3_heat1d.py (about 1 minute)',
    run: (dir) => runPython(dir, ['w3_heat1d.py']) },
  { ids: ['w4'], needs: 'python', label: 'python3 w4_heat2d.py (about 2 minutes)',
    run: (dir) => runPython(dir, ['w4_heat2d.py']) },
  { ids: ['w5'], needs: 'c', label: 'c/wave.c 1024 1000, gcc -O3 -march=native -std=c11',
    run: (dir) => runC(dir, 'wave', ['1024', '1000']) },
  { ids: ['w5'], needs: 'python', label: 'python3 w5_wave.py (about 2 minutes)',
    run: (dir) => runPython(dir, ['w5_wave.py']) },
];

/**
 * Runs the peers that can run here for the workloads in `wanted` (lower-case
 * ids; all when absent), prints their figures in the harness format and
 * returns them.
 */
export function runPeers(wanted?: ReadonlySet<string>): PeerLine[] {
  const found: PeerLine[] = [];
  const chosen = peerSources.filter((p) => !wanted || p.ids.some((id) => wanted.has(id)));
  if (chosen.length === 0) return found;
  const dir = peersDir();
  const av = availability();
  for (const w of av.why) process.stdout.write(`# peers: ${w}\n`);
  for (const p of chosen) {
    if (!(p.needs === 'c' ? av.c : av.python)) continue;
    process.stdout.write(`# peers: ${p.label}\n`);
    emit(p.run(dir), wanted, found);
  }
  return found;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const ids = process.argv.slice(2).map((a) => a.toLowerCase());
  runPeers(ids.length ? new Set(ids) : undefined);
}
