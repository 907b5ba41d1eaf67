/**
 * Explicit-step limits from the spectrum of the semi-discrete operator.
 *
 * For u' = M⁻¹A u (balance rows only; constrained nodes are held), forward
 * Euler is stable when dt·ρ ≤ 2, ρ the spectral radius of M⁻¹A, which for
 * diffusion operators is real and non-positive in spectrum; leapfrog for
 * u'' = M⁻¹A u is stable when dt·√ρ ≤ 2 (the CFL condition). Sources:
 * LeVeque, R. J. (2007), Finite Difference Methods for ODEs and PDEs, SIAM,
 * §9.3 and §10.5; Strikwerda, J. C. (2004), Finite Difference Schemes and
 * PDEs, 2nd ed., SIAM, ch. 2.
 *
 * Two estimates of ρ are made:
 * - the Gershgorin bound ρ ≤ maxᵢ Σⱼ |aᵢⱼ|/mᵢ over balance rows, an upper
 *   bound, so the limit 2/ρ_G is always safe; on uniform grids with
 *   constant coefficients it reproduces the textbook limits dt ≤ h²/(2α)
 *   (1-D) and h²/(4α) (2-D), CFL c·dt/h ≤ 1 (1-D) and 1/√2 (2-D);
 * - power iteration (30 steps from a seeded start), which approaches ρ from
 *   below and shows how much margin the bound leaves.
 *
 * The guard enforces the Gershgorin limit.
 *
 * With advection, u' = M⁻¹A u − B u with B the advection operator b·∇
 * (balance rows), the matrix is nonsymmetric and its eigenvalues complex.
 * Gershgorin still bounds them: each lies in a disc of centre cᵢ = aᵢᵢ and
 * radius Rᵢ = Σⱼ≠ᵢ |aᵢⱼ| (of M⁻¹A − B). Forward Euler maps the disc into
 * the unit disc around −1 iff |1 + dt·cᵢ| + dt·Rᵢ ≤ 1, which needs the disc
 * in the left half-plane, Rᵢ ≤ −cᵢ (diagonal dominance), and then gives
 * dt ≤ 2/(|cᵢ| + Rᵢ) = 2/Σⱼ|aᵢⱼ|, the bound above.
 * - upwind: every interior row is an M-matrix row (Rᵢ = |cᵢ|), so the
 *   Gershgorin limit holds; on a uniform grid with constant coefficients it
 *   is dt·Σₐ(2α/hₐ² + |bₐ|/hₐ) ≤ 1, which is also the exact von Neumann
 *   condition of the scheme (upwind = central with diffusion α + |b|h/2).
 * - central: Rᵢ = |cᵢ| while every cell Péclet number Pe = |bₐ|hₐ/α ≤ 2,
 *   but Rᵢ > |cᵢ| beyond, where Gershgorin certifies no step at all, though
 *   the eigenvalues of the periodic problem, −Σₐ(2α/hₐ²)(1 − cos θₐ) −
 *   iΣₐ(bₐ/hₐ) sin θₐ, stay in the left half-plane. The guard therefore uses
 *   the von Neumann conditions of forward Euler with central differences,
 *   necessary and sufficient for constant coefficients on a periodic grid:
 *   dt·Σₐ 2α/hₐ² ≤ 1 (the diffusive limit, the Gershgorin limit of M⁻¹A
 *   alone) and dt ≤ 2α/|b|², |b|² = Σₐ bₐ² (the advective limit). Proof of
 *   sufficiency: with g = 1 − Σ 2rₐsₐ − iΣ νₐ sin θₐ, rₐ = α dt/hₐ²,
 *   νₐ = bₐdt/hₐ, sₐ = 1 − cos θₐ, Cauchy–Schwarz gives (Σ νₐ sin θₐ)² ≤
 *   (Σ νₐ²/2rₐ)·Σ 2rₐsₐ(2 − sₐ), and Σ νₐ²/2rₐ = dt|b|²/2α ≤ 1 with
 *   Σ 2rₐ ≤ 1 leaves |g|² ≤ 1; necessity from θ → 0 and θₐ = π. The same
 *   conditions are in Hindmarsh, A. C., Gresho, P. M. & Griffiths, D. F.
 *   (1984). The stability of explicit Euler time-integration for certain
 *   finite difference approximations of the multi-dimensional
 *   advection–diffusion equation. Int. J. Numer. Meth. Fluids 4, 853–897;
 *   in 1-D: Strikwerda (2004), ch. 6, and Hirsch, C. (2007). Numerical
 *   Computation of Internal and External Flows, vol. 1, 2nd ed.,
 *   Butterworth-Heinemann (von Neumann analysis of the convection–diffusion
 *   equation). With
 *   varying coefficients the advective limit is taken node by node with
 *   the local α = k/ρc and b (frozen coefficients), and the one-sided rows
 *   at flux faces are not analysed apart from the interior. As α → 0 the
 *   advective limit goes to 0: central differences without diffusion are
 *   unstable under forward Euler at any step.
 *
 * The θ-method with θ < ½ is stable where dt·λ lies in the disc of centre
 * −1/(1 − 2θ) and radius 1/(1 − 2θ), the forward-Euler disc scaled by
 * 1/(1 − 2θ), so each limit divides by (1 − 2θ), for complex λ too.
 *
 * @module
 */
import type { Operator } from '../operator/operator.js';

/** Estimates of the spectral radius and the explicit step limits they imply. */
export interface StabilityLimit {
  /** Gershgorin upper bound on ρ(M⁻¹A) (1/s). */
  readonly gershgorin: number;
  /** Power-iteration estimate of ρ(M⁻¹A), a lower estimate (1/s). */
  readonly power: number;
  /** Forward Euler limit 2/ρ_G (s); with advection the limit the guard enforces, min(advection.diffusive, advection.advective). */
  readonly forwardEuler: number;
  /** Leapfrog limit 2/√ρ_G (s). */
  readonly leapfrog: number;
  /** With advection: its part of the forward Euler limit; undefined without advection. */
  readonly advection?: AdvectiveLimit;
}

/**
 * The parts of the forward Euler limit of an advection–diffusion operator
 * (module doc). `StabilityLimit.forwardEuler` is min(diffusive, advective),
 * and `gershgorin` and `power` are then those of M⁻¹A − B.
 */
export interface AdvectiveLimit {
  /** How the advection term is differenced. */
  readonly scheme: 'central' | 'upwind';
  /** Forward Euler limit of the diffusion part alone, 2/ρ_G(M⁻¹A) (s); h²/(2α) in 1-D. */
  readonly diffusive: number;
  /**
   * central: minᵢ 2αᵢ/|bᵢ|² over the balance nodes (s), the von Neumann
   * advective limit; upwind: 2/ρ_G(M⁻¹A − B), the Gershgorin limit of the
   * upwind rows (s), 1/(2α/h² + |b|/h) in 1-D. Infinity where b = 0.
   */
  readonly advective: number;
}

/**
 * Forward Euler limit of u' = M⁻¹A u − B u (module doc, both schemes).
 *
 * @param diffusion - A, the diffusion operator (constraint rows ignored)
 * @param total - A − diag(m)·B on the balance rows
 * @param scheme - the differencing of B
 * @param mass - mᵢ > 0 per node (ρc)
 * @param constrained - 1 at nodes held by a constraint
 * @param diffusivity - αᵢ = kᵢ/ρcᵢ per node (m²/s)
 * @param speedSquared - |bᵢ|² per node (m²/s²)
 * @returns the limits, `advection` filled in
 * @internal
 */
export function advectionDiffusionLimit(
  diffusion: Operator, total: Operator, scheme: 'central' | 'upwind', mass: Readonly<Float64Array>,
  constrained: Readonly<Uint8Array>, diffusivity: Readonly<Float64Array>, speedSquared: Readonly<Float64Array>,
): StabilityLimit {
  const diffusive = stabilityLimit(diffusion, mass, constrained).forwardEuler;
  const all = stabilityLimit(total, mass, constrained);
  let advective = Infinity;
  if (scheme === 'upwind') {
    advective = all.forwardEuler;
  } else {
    for (let i = 0; i < mass.length; i++) {
      if (!constrained[i] && speedSquared[i]! > 0) advective = Math.min(advective, (2 * diffusivity[i]!) / speedSquared[i]!);
    }
  }
  return { ...all, forwardEuler: Math.min(diffusive, advective), advection: { scheme, diffusive, advective } };
}

/**
 * Spectral-radius estimates of M⁻¹A on the balance rows (module doc).
 *
 * @param a - the operator A (rows at constrained nodes are ignored)
 * @param mass - mᵢ > 0 per node (ρc for heat, 1 for waves)
 * @param constrained - 1 at nodes held by a constraint
 * @returns the estimates and limits
 * @example stabilityLimit(laplacian(grid({ x: { from: 0, to: 1, cells: 10 } })), new Float64Array(11).fill(1), new Uint8Array(11)).forwardEuler // ≈ 0.005 = h²/2
 */
export function stabilityLimit(a: Operator, mass: Readonly<Float64Array>, constrained: Readonly<Uint8Array>): StabilityLimit {
  const m = a.matrix;
  const n = m.rows;
  let rhoG = 0;
  for (let r = 0; r < n; r++) {
    if (constrained[r]) continue;
    let s = 0;
    for (let p = m.rowPtr[r]!; p < m.rowPtr[r + 1]!; p++) if (!constrained[m.colIdx[p]!]) s += Math.abs(m.values[p]!);
    rhoG = Math.max(rhoG, s / mass[r]!);
  }
  // power iteration on the free block, seeded deterministic start
  let v = new Float64Array(n);
  let w = new Float64Array(n);
  let seed = 0x2545f491;
  for (let i = 0; i < n; i++) {
    seed = (seed * 1103515245 + 12345) >>> 0;
    v[i] = constrained[i] ? 0 : seed / 4294967296 - 0.5;
  }
  let rho = 0;
  for (let it = 0; it < 30; it++) {
    a.kernel(v, w);
    let num = 0;
    let den = 0;
    for (let i = 0; i < n; i++) {
      w[i] = constrained[i] ? 0 : w[i]! / mass[i]!;
      num += w[i]! * w[i]!;
      den += v[i]! * v[i]!;
    }
    if (den === 0 || num === 0) break;
    rho = Math.sqrt(num / den);
    const inv = 1 / Math.sqrt(num);
    for (let i = 0; i < n; i++) w[i]! *= inv;
    [v, w] = [w, v];
  }
  return {
    gershgorin: rhoG,
    power: rho,
    forwardEuler: rhoG > 0 ? 2 / rhoG : Infinity,
    leapfrog: rhoG > 0 ? 2 / Math.sqrt(rhoG) : Infinity,
  };
}
