/**
 * The benchmark runner behind `npm run bench`.
 *
 * ```
 * npm run bench                       every case of every group (about 2 minutes on 2 cores)
 * npm run bench -- W1                 one workload (ids: S1, S2, W1, W1b, W2, …; W2 = every W2 case)
 * npm run bench -- W2-assembly        one case by its unique name (see --list)
 * npm run bench -- stencil            one group (stencil, operator, …)
 * npm run bench -- peers              the workloads that have peers (W1 … W5), then the
 *                                     C / numpy / scipy peers, then same-session ratios
 * npm run bench -- W1 peers           W1 and its peers (`--peers` is the same as the word `peers`)
 * npm run bench -- W1 peers --rounds=3   alternate quadrille and peers 3 times; median ratios
 * npm run bench -- --runs=21          timed runs per figure (default 11, at least 5)
 * npm run bench -- --in-process       all cases in this process (default: one child process per case)
 * npm run bench -- --list             the cases
 * ```
 *
 * Result lines follow WORKLOADS.md (`W1 impl=quadrille variant=… path=ts n=… median_s=…`);
 * every other line starts with `#`. Each case runs in its own Node process by
 * default, so peak RSS and JIT state belong to that case alone.
 *
 * Peers (bench/reference/peers.ts) run only when ../shared/peers (or
 * $QUADRILLE_PEERS) exists and gcc, or python3 with numpy and scipy, is
 * found; nothing in the library or its tests depends on them.
 *
 * To add a group: write `bench/<group>/<name>.bench.ts` exporting
 * `cases: readonly BenchCase[]` (each with that `group`), import it below and
 * add it to {@link registry}; ratios against peers go in {@link ratioRules},
 * the peer programs in `peerSources` of bench/reference/peers.ts.
 *
 * @module
 */
import { spawnSync } from 'node:child_process';
import { cpus } from 'node:os';
import { fileURLToPath } from 'node:url';
import { cases as operatorCases } from './operator/w1.bench.js';
import { type BenchCase, caseName, defaultRuns, note, setDefaultRuns } from './harness.js';
import { type PeerLine, peerSources, runPeers } from './reference/peers.js';
import { cases as stencilCases } from './stencil/weights.bench.js';
import { cases as timeCases } from './time/transient.bench.js';
import { cases as linalgCases } from './linalg/w2.bench.js';

/** The workload groups, in run order: group name → its cases. */
const registry: Readonly<Record<string, readonly BenchCase[]>> = {
  stencil: stencilCases,
  operator: operatorCases,
  linalg: linalgCases,
  time: timeCases,
};

const all: readonly BenchCase[] = Object.entries(registry).flatMap(([group, cs]) => {
  for (const c of cs) {
    if (c.group !== group) throw new Error(`case ${caseName(c)} has group ${c.group} but is registered under ${group}`);
  }
  return cs;
});
{
  const names = all.map((c) => caseName(c).toLowerCase());
  const twice = names.filter((k, i) => names.indexOf(k) !== i);
  if (twice.length) throw new Error(`case names must be unique; give a name to: ${twice.join(', ')}`);
}

/** Workload ids that have a registered peer (lower case). */
const peerIds = new Set(peerSources.flatMap((p) => p.ids));

interface Args {
  readonly selection: string[];
  readonly runs: number | undefined;
  readonly peers: boolean;
  readonly inProcess: boolean;
  readonly list: boolean;
  readonly child: string | undefined;
  readonly rounds: number;
}

function parseArgs(argv: readonly string[]): Args {
  const selection: string[] = [];
  let runs: number | undefined;
  let peers = false;
  let inProcess = false;
  let list = false;
  let child: string | undefined;
  let rounds = 1;
  for (const a of argv) {
    if (a.startsWith('--runs=')) runs = Number(a.slice(7));
    else if (a.startsWith('--rounds=')) rounds = Number(a.slice(9));
    else if (a === '--peers') peers = true;
    else if (a === '--in-process') inProcess = true;
    else if (a === '--list') list = true;
    else if (a.startsWith('--child=')) child = a.slice(8);
    else if (a.startsWith('--')) throw new Error(`unknown option ${a}; see the header of bench/run.ts`);
    else if (a.toLowerCase() === 'peers') peers = true;
    else selection.push(a.toLowerCase());
  }
  if (runs !== undefined && !(Number.isInteger(runs) && runs >= 5)) {
    throw new Error(`--runs=${runs}: use a whole number ≥ 5`);
  }
  if (!(Number.isInteger(rounds) && rounds >= 1)) throw new Error(`--rounds=${rounds}: use a whole number ≥ 1`);
  return { selection, runs, peers, inProcess, list, child, rounds };
}

/** The cases named by id, unique name or group; all when none (with `peers` alone: those with peers). */
function select(selection: readonly string[], peers: boolean): BenchCase[] {
  const keys = (c: BenchCase) => [c.id.toLowerCase(), caseName(c).toLowerCase(), c.group];
  const known = new Set(all.flatMap(keys));
  const unknown = selection.filter((s) => !known.has(s));
  if (unknown.length) {
    throw new Error(`unknown workload, case or group ${unknown.join(', ')}; known: ${[...known].join(', ')}, peers`);
  }
  if (selection.length === 0) return all.filter((c) => !peers || peerIds.has(c.id.toLowerCase()));
  return all.filter((c) => keys(c).some((k) => selection.includes(k)));
}

/** A result line split into its id and fields. */
interface Parsed {
  readonly id: string;
  readonly fields: ReadonlyMap<string, string>;
}

function parseLine(line: string): Parsed | undefined {
  if (line.startsWith('#') || line.trim() === '') return undefined;
  const [id, ...rest] = line.trim().split(/\s+/);
  const fields = new Map<string, string>();
  for (const w of rest) {
    const eq = w.indexOf('=');
    if (eq > 0) fields.set(w.slice(0, eq), w.slice(eq + 1));
  }
  return fields.has('impl') ? { id, fields } : undefined;
}

function runChild(c: BenchCase, runs: number): { lines: Parsed[]; ok: boolean } {
  const script = fileURLToPath(import.meta.url);
  const r = spawnSync(process.execPath, [...process.execArgv, script, `--child=${caseName(c)}`, `--runs=${runs}`], {
    encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], maxBuffer: 1 << 26,
  });
  const out = r.stdout ?? '';
  process.stdout.write(out);
  const lines = out.split('\n').map(parseLine).filter((p): p is Parsed => p !== undefined);
  return { lines, ok: r.status === 0 };
}

function capture(body: () => void): Parsed[] {
  const lines: Parsed[] = [];
  const write = process.stdout.write.bind(process.stdout);
  let pending = '';
  process.stdout.write = ((chunk: string | Uint8Array, ...rest: never[]) => {
    pending += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8');
    let nl: number;
    while ((nl = pending.indexOf('\n')) >= 0) {
      const p = parseLine(pending.slice(0, nl));
      if (p) lines.push(p);
      pending = pending.slice(nl + 1);
    }
    return write(chunk, ...rest);
  }) as typeof process.stdout.write;
  try {
    body();
  } finally {
    process.stdout.write = write;
  }
  return lines;
}

function figure(lines: readonly Parsed[], id: string, impl: string, variant: string, key: string): number | undefined {
  const l = lines.find((p) => p.id === id && p.fields.get('impl') === impl && p.fields.get('variant') === variant);
  const v = l ? Number(l.fields.get(key)) : NaN;
  return Number.isFinite(v) ? v : undefined;
}

/**
 * Same-session ratios: [label, workload id, peer impl, peer variant,
 * quadrille variant, keys]; printed as peer figure / quadrille figure (> 1:
 * quadrille faster; against C it is the fraction of C's throughput). By
 * default both medians (`median_s`) and both fastest runs (`min_s`, which a
 * busy shared machine disturbs less) are compared; a rule with keys compares
 * exactly those [quadrille key, peer key] pairs. The W3 and W4 peers time
 * factorisation plus steps in `median_s`; quadrille's `median_s` is the
 * stepping loop and `total_s` the whole call, discretisation included. W3's
 * target is per step (the loop against the peers' steps), W4's the whole
 * job, so both are printed.
 */
const ratioRules: ReadonlyArray<readonly [string, string, string, string, string, ReadonlyArray<readonly [string, string]>?]> = [
  ['W1 matrix-free vs numpy slice-blocked', 'W1', 'numpy', 'slice-blocked', 'matrix-free'],
  ['W1 matrix-free vs numpy slice-out', 'W1', 'numpy', 'slice-out', 'matrix-free'],
  ['W1 matrix-free vs C -O3 (fraction of C throughput)', 'W1', 'c', 'O3', 'matrix-free'],
  ['W1 matrix-free vs quadrille naive-ndarray', 'W1', 'quadrille', 'naive-ndarray', 'matrix-free'],
  ['W1b matrix-free vs numpy slice-blocked', 'W1b', 'numpy', 'slice-blocked', 'matrix-free'],
  ['W1b matrix-free vs numpy slice-out', 'W1b', 'numpy', 'slice-out', 'matrix-free'],
  ['W1b matrix-free vs C -O3 (fraction of C throughput)', 'W1b', 'c', 'O3', 'matrix-free'],
  ['W1b matrix-free vs quadrille naive-ndarray', 'W1b', 'quadrille', 'naive-ndarray', 'matrix-free'],
  ['W1 csr vs scipy csr (A @ x)', 'W1', 'scipy', 'csr', 'csr'],
  ['W1 csr vs scipy csr-prealloc', 'W1', 'scipy', 'csr-prealloc', 'csr'],
  ['W1 csr-plain (no inspection) vs scipy csr (A @ x)', 'W1', 'scipy', 'csr', 'csr-plain'],
  ['W1 csr vs quadrille matrix-free (> 1: matrix-free faster)', 'W1', 'quadrille', 'csr', 'matrix-free'],
  ['W2 assemble-csr (allocation included) vs scipy kron to CSR', 'W2', 'scipy', 'assembly-kron-csr', 'assemble-csr'],
  ['W2 assemble-csr (allocation included) vs scipy kron to CSC', 'W2', 'scipy', 'assembly-kron-csc', 'assemble-csr'],
  ['W3 per step: stepping loop vs scipy solve_banded (100 steps, each factoring)', 'W3', 'scipy', 'solve_banded', 'cn-thomas'],
  ['W3 per step: stepping loop vs C Thomas factored once (factorisation + steps; fraction of C)', 'W3', 'c', 'O3-thomas-factor-once', 'cn-thomas'],
  ['W3 whole call (discretisation and factorisation included) vs scipy solve_banded', 'W3', 'scipy', 'solve_banded', 'cn-thomas', [['total_s', 'median_s']]],
  ['W3 whole call vs C Thomas factored once (fraction of C)', 'W3', 'c', 'O3-thomas-factor-once', 'cn-thomas', [['total_s', 'median_s']]],
  ['W4 whole call (discretisation, set-up, 50 steps) vs scipy splu (factor + 50 solves)', 'W4', 'scipy', 'splu', 'cn-auto', [['total_s', 'median_s']]],
  ['W4 whole call vs scipy splu with MMD ordering', 'W4', 'scipy', 'splu-mmd', 'cn-auto', [['total_s', 'median_s']]],
  ['W4 per step vs scipy splu per step', 'W4', 'scipy', 'splu', 'cn-auto', [['per_step_s', 's_per_step']]],
  ['W4 multigrid PCG whole call vs scipy splu', 'W4', 'scipy', 'splu', 'cn-mg-pcg', [['total_s', 'median_s']]],
  ['W5 leapfrog vs numpy slice-blocked', 'W5', 'numpy', 'slice-blocked', 'leapfrog'],
  ['W5 leapfrog vs numpy slice-out', 'W5', 'numpy', 'slice-out', 'leapfrog'],
  ['W5 leapfrog vs C -O3 (fraction of C throughput)', 'W5', 'c', 'O3', 'leapfrog'],
];

function ratios(ours: readonly Parsed[], peers: readonly PeerLine[]): Map<string, number> {
  const theirs: Parsed[] = peers.map((p) => ({
    id: p.id, fields: new Map([['impl', p.impl], ['variant', p.variant], ...p.fields]),
  }));
  const lines = [...ours, ...theirs];
  const r = new Map<string, number>();
  for (const [label, id, impl, variant, q, keys] of ratioRules) {
    for (const [mineKey, peerKey] of keys ?? [['median_s', 'median_s'], ['min_s', 'min_s']] as const) {
      const peer = figure(lines, id, impl, variant, peerKey);
      const mine = figure(lines, id, 'quadrille', q, mineKey);
      const tag = keys === undefined ? (mineKey === 'median_s' ? 'median' : 'min') : `${mineKey} / ${peerKey}`;
      if (peer !== undefined && mine !== undefined) r.set(`${label} [${tag}]`, peer / mine);
    }
  }
  return r;
}

function printRatios(title: string, r: ReadonlyMap<string, number>): void {
  note(title);
  for (const [k, v] of r) note(`  ${k}: ${v.toFixed(2)}`);
}

function main(): void {
  const args = parseArgs(process.argv.slice(2));
  setDefaultRuns(args.runs);
  if (args.child !== undefined) {
    const c = all.find((k) => caseName(k) === args.child);
    if (!c) throw new Error(`no case ${args.child}`);
    c.run({ runs: defaultRuns() });
    return;
  }
  if (args.list) {
    for (const c of all) note(`${caseName(c).padEnd(12)} ${c.id.padEnd(4)} ${c.group.padEnd(9)} ${c.title}`);
    return;
  }
  const chosen = select(args.selection, args.peers);
  const runs = defaultRuns();
  note(`quadrille bench: node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'}, ${runs} timed runs per figure`);
  let failed = false;
  const perRound: Map<string, number>[] = [];
  for (let round = 1; round <= args.rounds; round++) {
    if (args.rounds > 1) note(`round ${round} of ${args.rounds}`);
    const ours: Parsed[] = [];
    for (const c of chosen) {
      if (args.inProcess) {
        ours.push(...capture(() => c.run({ runs })));
      } else {
        const r = runChild(c, runs);
        ours.push(...r.lines);
        if (!r.ok) {
          note(`${c.id} failed`);
          failed = true;
        }
      }
    }
    if (args.peers) {
      const peers = runPeers(new Set(chosen.map((c) => c.id.toLowerCase())));
      const r = ratios(ours, peers);
      perRound.push(r);
      printRatios(`ratios in this session${args.rounds > 1 ? `, round ${round}` : ''}, peer / quadrille time, of medians and of fastest runs (> 1: quadrille faster):`, r);
    }
  }
  if (perRound.length > 1) {
    const med = new Map<string, number>();
    for (const k of perRound[0].keys()) {
      const vs = perRound.map((r) => r.get(k)).filter((v): v is number => v !== undefined).sort((a, b) => a - b);
      const m = vs.length;
      med.set(k, m % 2 ? vs[(m - 1) / 2] : 0.5 * (vs[m / 2 - 1] + vs[m / 2]));
    }
    printRatios(`median over ${perRound.length} rounds of the per-round ratios:`, med);
  }
  if (failed) process.exitCode = 1;
}

main();
