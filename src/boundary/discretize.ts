/**
 * Boundary conditions applied: a grid, a conductivity and per-face
 * conditions become the discrete operator, its boundary data, and the
 * linear system of a steady problem.
 *
 * Rows. Every node keeps its unknown (see the operator stage). A node's row
 * is either a *balance row* — the discrete value of ∇·(k∇u) at the node,
 * (Au)ᵢ + gᵢ(t), with the boundary data gᵢ of flux and convection faces — or
 * a *constraint row* Bᵢu = cᵢ(t): the identity with the prescribed value on
 * value faces, and, at accuracy 4 and 6, the discretised flux or convection
 * condition itself on those faces. `constrained[i]` says which.
 *
 * Closures and their accuracy:
 * - accuracy 2 (any k, uniform or stretched axes): the vertex-centred
 *   finite-volume operator of `diffusionOperator`; a flux or convection face
 *   adds its flow over the half control volume of each boundary node, which
 *   on a uniform grid with constant k is exactly the ghost-node elimination
 *   with a central flux difference. Second order, symmetric after scaling
 *   each balance row by its control volume Vᵢ (the system below does it).
 * - accuracy 4 or 6 (constant k, uniform axes): k·Δ of `laplacian` with its
 *   biased closure rows next to the boundary, and on flux / convection faces
 *   the condition with a one-sided first derivative of the same accuracy
 *   (Fornberg 1988, Table 3). Order p; the system is not symmetric, so choose
 *   a solver for nonsymmetric systems.
 *
 * @module
 */
import { InvalidAccuracyError, InvalidOptionError, NonFiniteValueError, ShapeMismatchError } from '../errors.js';
import { type FaceName, type Field, type Grid, trapezoidWeights } from '../grid/index.js';
import { checkField } from '../grid/field.js';
import { lineTable } from '../operator/lines.js';
import { laplacian } from '../operator/derivative.js';
import { gridStrides } from '../operator/derivative.js';
import {
  type Coefficient, assembleConservative, controlVolumes, forEachNode, nodeCoordinates, sampleCoefficient, sampleNodal,
} from '../operator/diffusion.js';
import { CsrBuilder, type CsrMatrix, csrMultiply } from '../operator/matrix.js';
import { type Operator, makeOperator } from '../operator/operator.js';
import {
  type BoundaryConditions, type BoundarySpec, type Condition, boundaryConditions, evalCoefficient, evalData,
} from './conditions.js';

/** A volumetric source: constant, function of coordinates then time, or a nodal field. */
export type Source = number | ((...coordinatesThenTime: number[]) => number) | Field;

/** What {@link discretize} builds. */
export interface DiscretizeOptions {
  /** k > 0: constant, function of position, or nodal field (default 1). Constant only at accuracy 4 and 6. */
  readonly conductivity?: Coefficient;
  /** The condition of every face: a spec, or conditions already validated for this grid. */
  readonly boundary: BoundarySpec | BoundaryConditions;
  /** p in O(hᵖ): 2 (default), 4 or 6; 4 and 6 need uniform axes and constant k. */
  readonly accuracy?: number;
}

/** A linear system A u = b over the grid's nodes. */
export interface LinearSystem {
  /** The matrix, symmetric positive definite when the discretisation is symmetric and some face holds a value or convects. */
  readonly matrix: Operator;
  /** The right-hand side. */
  readonly rhs: Float64Array;
}

/** The net flow out through one face. */
export interface FaceFlow {
  /** The face. */
  readonly face: FaceName;
  /** Net flow out (same unit as {@link HeatBalance.source}). */
  readonly outflow: number;
}

/** Heat flows of a field, for checking a steady solution. */
export interface HeatBalance {
  /** ∫ f dV by the control volumes (W in 3-D, W/m per unit depth in 2-D, W/m² in 1-D). */
  readonly source: number;
  /** Net flow out through all faces, same unit. */
  readonly outflow: number;
  /** Net flow out through each face. */
  readonly faces: readonly FaceFlow[];
  /** source − outflow: zero, to round-off, for a steady solution. */
  readonly imbalance: number;
  /** |imbalance| / (|source| + Σ|face flows|). */
  readonly relative: number;
}

/** The discrete operator of a diffusion problem with its boundary conditions. */
export interface Discretization {
  /** The grid. */
  readonly grid: Grid;
  /** Accuracy order p. */
  readonly accuracy: number;
  /** The validated conditions. */
  readonly conditions: BoundaryConditions;
  /** Nodal conductivity. */
  readonly conductivity: Readonly<Float64Array>;
  /** A: balance rows and constraint rows (module doc). */
  readonly operator: Operator;
  /**
   * S: the balance rows multiplied by their control volumes, diag(V)·A
   * (at accuracy 2 assembled so that it is exactly symmetric), and the
   * constraint rows as in A. What implicit time steps are built from.
   */
  readonly scaledOperator: Operator;
  /** 1 where the node's row is a constraint, 0 where it is a balance row. */
  readonly constrained: Readonly<Uint8Array>;
  /** 1 where the node's value is prescribed (on a value face). */
  readonly prescribed: Readonly<Uint8Array>;
  /** Control volume of each node (m³, or m² / m in 2-D / 1-D). */
  readonly volumes: Readonly<Float64Array>;
  /** Whether {@link Discretization.system} gives a symmetric matrix (accuracy 2). */
  readonly symmetric: boolean;
  /**
   * The boundary vector at time t: gᵢ(t) on balance rows, cᵢ(t) on constraint rows.
   *
   * @param t - time (default 0)
   * @param out - where to write, `grid.size` entries
   * @returns `out`, or a new array
   */
  boundaryTerm(t?: number, out?: Float64Array): Float64Array;
  /**
   * The steady system for −∇·(k∇u) = f: balance rows −Vᵢ(Au)ᵢ = Vᵢ(gᵢ + fᵢ),
   * constraint rows Bᵢu = cᵢ, with prescribed values moved to the right-hand
   * side so the matrix stays symmetric (accuracy 2).
   *
   * @param options - the source f (default 0) and the time t of the data (default 0)
   * @returns matrix and right-hand side
   */
  system(options?: Readonly<{ source?: Source; t?: number }>): LinearSystem;
  /**
   * Net heat flows of a field through each face against the integrated
   * source (accuracy 2 only, where the operator is conservative).
   *
   * @param u - nodal values (field or flat array)
   * @param options - the source f and the time t of the data
   * @returns the balance
   */
  heatBalance(u: Field | Float64Array, options?: Readonly<{ source?: Source; t?: number }>): HeatBalance;
}

interface FaceNodes {
  face: FaceName;
  condition: Condition;
  axis: number;
  /** +1 at a max face, −1 at a min face (outward normal along the axis). */
  side: number;
  nodes: Int32Array;
  /** Share of the control-volume boundary on this face, per node. */
  area: Float64Array;
  /** Control-volume width along the normal, per node. */
  width: Float64Array;
  coords: number[][];
}

function faceNodes(g: Grid, bc: BoundaryConditions): FaceNodes[] {
  const w = g.axes.map((a) => trapezoidWeights(a));
  const out: FaceNodes[] = [];
  for (const { face, condition } of bc.faces) {
    const axis = ['x', 'y', 'z'].indexOf(face[0]!);
    const side = face.endsWith('max') ? 1 : -1;
    const at = side > 0 ? g.axes[axis]!.count - 1 : 0;
    const nodes: number[] = [];
    const area: number[] = [];
    const width: number[] = [];
    const coords: number[][] = [];
    forEachNode(g, (r, i, j, k) => {
      const idx = [i, j, k];
      if (idx[axis] !== at) return;
      nodes.push(r);
      let a = 1;
      for (let d = 0; d < g.dimension; d++) if (d !== axis) a *= w[d]![idx[d]!]!;
      area.push(a);
      width.push(w[axis]![at]!);
      coords.push(nodeCoordinates(g, i, j, k));
    });
    out.push({ face, condition, axis, side, nodes: Int32Array.from(nodes), area: Float64Array.from(area), width: Float64Array.from(width), coords });
  }
  return out;
}

/** Nodal values of a source at time t. @internal */
export function sampleSource(g: Grid, f: Source | undefined, t: number, out: Float64Array): Float64Array {
  if (f === undefined) return out.fill(0);
  return sampleNodal(g, f, 'source', (v, kind, where) => {
    if (Number.isFinite(v)) return;
    if (kind === 'function') throw new NonFiniteValueError(`source${where()}, t = ${t}`, v);
    throw new InvalidOptionError('source', `${v}${where()} is not finite; give finite values`);
  }, [t], out);
}

function flat(g: Grid, u: Field | Float64Array): Float64Array {
  if (u instanceof Float64Array) {
    if (u.length !== g.size) throw new ShapeMismatchError(`u has ${u.length} entries but the grid has ${g.size} nodes`);
    return u;
  }
  checkField(g, u, 'u');
  return sampleNodal(g, u, 'u', () => undefined);
}

/**
 * The discrete diffusion operator ∇·(k∇u) of a grid with boundary
 * conditions (see the module doc for the rows and closures).
 *
 * @param g - the grid
 * @param options - conductivity, boundary conditions, accuracy
 * @returns the discretisation
 * @example discretize(grid({ x: { from: 0, to: 1, cells: 4 } }), { boundary: { xmin: { kind: 'dirichlet', value: 1 }, xmax: { kind: 'dirichlet', value: 0 } } }).symmetric // true
 */
export function discretize(g: Grid, options: Readonly<DiscretizeOptions>): Discretization {
  const p = options.accuracy ?? 2;
  if (![2, 4, 6].includes(p)) throw new InvalidAccuracyError(p, 'boundary closures are built at accuracy 2, 4 or 6');
  const bc = 'faces' in options.boundary && 'grid' in options.boundary && !Array.isArray(options.boundary)
    ? (options.boundary as BoundaryConditions)
    : boundaryConditions(g, options.boundary as BoundarySpec);
  if (bc.grid !== g) throw new InvalidOptionError('boundary', 'the conditions were validated for another grid; validate them for this one');
  const kSpec = options.conductivity ?? 1;
  if (p !== 2) {
    if (typeof kSpec !== 'number') {
      throw new InvalidAccuracyError(p, 'variable conductivity is discretised conservatively at accuracy 2 only; use accuracy 2 or a constant k');
    }
    const bad = g.axes.find((a) => !a.uniform);
    if (bad !== undefined) throw new InvalidAccuracyError(p, `axis ${bad.name} is stretched; accuracy ${p} needs uniform axes, use accuracy 2`);
  }
  const k = sampleCoefficient(g, kSpec, 'conductivity');
  const faces = faceNodes(g, bc);
  const n = g.size;
  const volumes = controlVolumes(g);
  const prescribed = new Uint8Array(n);
  for (const f of faces) if (f.condition.kind === 'dirichlet') for (const r of f.nodes) prescribed[r] = 1;

  const constrained = new Uint8Array(n);
  let build: () => CsrMatrix;
  // robin coefficient h per face node, sampled once
  const hOf = faces.map((f) =>
    f.condition.kind === 'robin' ? Float64Array.from(f.coords, (c) => evalCoefficient((f.condition as { h: number }).h, c, `h on ${f.face}`)) : undefined);
  // which face owns a flux node's constraint row at accuracy > 2: the first in face order
  const owner = new Int32Array(n).fill(-1);

  // convection enters the volume-scaled diagonal as −h·area (accuracy 2)
  const robinDiag = new Float64Array(n);
  if (p === 2) {
    constrained.set(prescribed);
    faces.forEach((f, fi) => {
      const h = hOf[fi];
      if (h === undefined) return;
      f.nodes.forEach((r, q) => {
        if (!prescribed[r]) robinDiag[r]! -= h[q]! * f.area[q]!;
      });
    });
    build = () => assembleConservative(g, k, { scaledDiagonal: robinDiag, constrained, scaled: false });
  } else {
    constrained.set(prescribed);
    faces.forEach((f, fi) => {
      if (f.condition.kind === 'dirichlet') return;
      for (const r of f.nodes) {
        if (!prescribed[r] && owner[r] === -1) {
          owner[r] = fi;
          constrained[r] = 1;
        }
      }
    });
    const kc = kSpec as number;
    const lap = laplacian(g, { accuracy: p });
    const strides = gridStrides(g);
    const oneSided = g.axes.map((a) => lineTable(a, 1, p));
    build = () => {
      const raw = lap.matrix;
      const b = new CsrBuilder(n, n, raw.values.length + n);
      const faceIndex = new Int32Array(n).fill(-1);
      faces.forEach((f, fi) => f.nodes.forEach((r, q) => { if (owner[r] === fi) faceIndex[r] = q; }));
      for (let r = 0; r < n; r++) {
        if (prescribed[r]) {
          b.add(r, 1);
        } else if (owner[r]! >= 0) {
          const f = faces[owner[r]!]!;
          const t = oneSided[f.axis]!;
          const i = f.side > 0 ? t.n - 1 : 0;
          // −k ∂u/∂n = k·(−side)·∂u/∂x_axis; one-sided weights of the boundary row
          for (let q = t.ptr[i]!; q < t.ptr[i + 1]!; q++) b.add(r + t.offsets[q]! * strides[f.axis]!, -f.side * kc * t.weights[q]!);
          const h = hOf[owner[r]!];
          if (h !== undefined) b.add(r, -h[faceIndex[r]!]!);
        } else {
          for (let q = raw.rowPtr[r]!; q < raw.rowPtr[r + 1]!; q++) b.add(raw.colIdx[q]!, kc * raw.values[q]!);
        }
        b.endRow();
      }
      return b.finish();
    };
  }

  const operator = makeOperator({ rows: n, cols: n, shape: g.shape, symmetric: false, build });
  const scaledOperator = makeOperator({
    rows: n,
    cols: n,
    shape: g.shape,
    symmetric: false,
    build: () => {
      if (p === 2) return assembleConservative(g, k, { scaledDiagonal: robinDiag, constrained, scaled: true });
      const a = operator.matrix;
      const values = Float64Array.from(a.values);
      for (let r = 0; r < n; r++) {
        if (constrained[r]) continue;
        for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) values[q]! *= volumes[r]!;
      }
      return { ...a, values };
    },
  });

  const count = new Uint8Array(n); // value faces met at each node, reused by every call
  const boundaryTerm = (t = 0, out?: Float64Array): Float64Array => {
    const y = out ?? new Float64Array(n);
    if (y.length !== n) throw new ShapeMismatchError(`out has ${y.length} entries but the grid has ${n} nodes`);
    y.fill(0);
    count.fill(0);
    faces.forEach((f, fi) => {
      const c = f.condition;
      f.nodes.forEach((r, q) => {
        const xs = f.coords[q]!;
        if (c.kind === 'dirichlet') {
          // mean of the values of the value faces meeting at the node
          y[r] = (y[r]! * count[r]! + evalData(c.value, xs, t, `value on ${f.face}`)) / (count[r]! + 1);
          count[r]!++;
          return;
        }
        if (prescribed[r]) return;
        if (p === 2) {
          const flow = c.kind === 'neumann'
            ? -evalData(c.flux, xs, t, `flux on ${f.face}`)
            : hOf[fi]![q]! * evalData(c.ambient, xs, t, `ambient on ${f.face}`);
          y[r]! += flow / f.width[q]!;
        } else if (owner[r] === fi) {
          y[r] = c.kind === 'neumann'
            ? evalData(c.flux, xs, t, `flux on ${f.face}`)
            : -hOf[fi]![q]! * evalData(c.ambient, xs, t, `ambient on ${f.face}`);
        }
      });
    });
    return y;
  };

  const system = (opts: Readonly<{ source?: Source; t?: number }> = {}): LinearSystem => {
    const t = opts.t ?? 0;
    const f = sampleSource(g, opts.source, t, new Float64Array(n));
    const gvec = boundaryTerm(t);
    // accuracy 2: the exactly symmetric volume-scaled form S = diag(V)·A
    const a = p === 2 ? scaledOperator.matrix : operator.matrix;
    const b = new CsrBuilder(n, n, a.values.length);
    const rhs = new Float64Array(n);
    for (let r = 0; r < n; r++) {
      if (prescribed[r]) {
        b.add(r, 1);
        rhs[r] = gvec[r]!;
      } else if (constrained[r]) {
        let c = gvec[r]!;
        for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) {
          const j = a.colIdx[q]!;
          if (prescribed[j] && j !== r) c -= a.values[q]! * gvec[j]!;
          else b.add(j, a.values[q]!);
        }
        rhs[r] = c;
      } else {
        // balance row: −(S u)ᵢ = Vᵢ(gᵢ + fᵢ), prescribed neighbours moved right
        const v = volumes[r]!;
        const s = p === 2 ? 1 : v;
        let c = v * (gvec[r]! + f[r]!);
        for (let q = a.rowPtr[r]!; q < a.rowPtr[r + 1]!; q++) {
          const j = a.colIdx[q]!;
          if (prescribed[j]) c += s * a.values[q]! * gvec[j]!;
          else b.add(j, -s * a.values[q]!);
        }
        rhs[r] = c;
      }
      b.endRow();
    }
    const m = b.finish();
    return { matrix: makeOperator({ rows: n, cols: n, shape: g.shape, symmetric: p === 2, build: () => m }), rhs };
  };

  let raw: CsrMatrix | undefined;
  const heatBalance = (u: Field | Float64Array, opts: Readonly<{ source?: Source; t?: number }> = {}): HeatBalance => {
    if (p !== 2) {
      throw new InvalidAccuracyError(p, 'the heat balance closes to round-off only for the conservative accuracy-2 operator; discretise at accuracy 2');
    }
    const t = opts.t ?? 0;
    const x = flat(g, u);
    const f = sampleSource(g, opts.source, t, new Float64Array(n));
    raw ??= assembleConservative(g, k, { scaled: false });
    let source = 0;
    for (let r = 0; r < n; r++) source += volumes[r]! * f[r]!;
    const perFace = new Float64Array(faces.length);
    // prescribed flows through flux / convection faces, node by node
    const given = new Float64Array(n);
    const valueFaces = new Uint8Array(n);
    faces.forEach((fc, fi) => {
      const c = fc.condition;
      fc.nodes.forEach((r, q) => {
        if (c.kind === 'dirichlet') {
          valueFaces[r]!++;
          return;
        }
        const xs = fc.coords[q]!;
        const flux = c.kind === 'neumann'
          ? evalData(c.flux, xs, t, `flux on ${fc.face}`)
          : hOf[fi]![q]! * (x[r]! - evalData(c.ambient, xs, t, `ambient on ${fc.face}`));
        const flow = flux * fc.area[q]!;
        perFace[fi]! += flow;
        given[r]! += flow;
      });
    });
    // value nodes: what the cell's balance leaves over, shared among its value faces
    const au = csrMultiply(raw, x, new Float64Array(n));
    faces.forEach((fc, fi) => {
      if (fc.condition.kind !== 'dirichlet') return;
      for (const r of fc.nodes) perFace[fi]! += (volumes[r]! * (au[r]! + f[r]!) - given[r]!) / valueFaces[r]!;
    });
    let outflow = 0;
    let scale = Math.abs(source);
    for (let fi = 0; fi < faces.length; fi++) {
      outflow += perFace[fi]!;
      scale += Math.abs(perFace[fi]!);
    }
    const imbalance = source - outflow;
    return {
      source,
      outflow,
      faces: faces.map((fc, fi) => ({ face: fc.face, outflow: perFace[fi]! })),
      imbalance,
      relative: scale > 0 ? Math.abs(imbalance) / scale : 0,
    };
  };

  return Object.freeze({
    grid: g,
    accuracy: p,
    conditions: bc,
    conductivity: k,
    operator,
    scaledOperator,
    constrained,
    prescribed,
    volumes,
    symmetric: p === 2,
    boundaryTerm,
    system,
    heatBalance,
  });
}
