/**
 * Exact Riemann solver for the LWR equation k_t + q(k)_x = 0 with a concave q:
 * initial data k = kL for x < 0 and k = kR for x > 0.
 *
 *   kL < kR: one shock with the Rankine-Hugoniot speed s = (q(kR) - q(kL)) / (kR - kL)
 *            (the only entropy-admissible wave for a concave flux);
 *   kL > kR: a rarefaction fan k(xi) = (q')^-1(xi) for q'(kL) <= xi <= q'(kR), xi = x / t.
 *            Where q' is constant on a branch (triangular diagram) the fan degenerates into
 *            contact discontinuities at speed vf or -w.
 * The solution is self-similar: `sample(xi)` returns k(x/t).
 */
import { type Diagram, criticalDensity, densityAtWaveSpeed, flux, waveSpeed } from './fundamental-diagram'

export type Wave =
  | { type: 'shock'; speed: number; kLeft: number; kRight: number }
  | { type: 'contact'; speed: number; kLeft: number; kRight: number }
  | { type: 'rarefaction'; tailSpeed: number; headSpeed: number; kLeft: number; kRight: number }

export interface RiemannSolution {
  kLeft: number
  kRight: number
  waves: Wave[]
  /** density at x/t = xi */
  sample(xi: number): number
}

export function solveRiemann(d: Diagram, kL: number, kR: number): RiemannSolution {
  if (kL === kR) return { kLeft: kL, kRight: kR, waves: [], sample: () => kL }

  if (kL < kR) {
    const s = (flux(d, kR) - flux(d, kL)) / (kR - kL)
    return {
      kLeft: kL,
      kRight: kR,
      waves: [{ type: 'shock', speed: s, kLeft: kL, kRight: kR }],
      sample: (xi) => (xi < s ? kL : kR),
    }
  }

  const cL = waveSpeed(d, kL)
  const cR = waveSpeed(d, kR)
  const sample = (xi: number): number => {
    if (xi <= cL) return kL
    if (xi >= cR) return kR
    return Math.min(kL, Math.max(kR, densityAtWaveSpeed(d, xi)))
  }
  return { kLeft: kL, kRight: kR, waves: fanWaves(d, kL, kR, cL, cR), sample }
}

function fanWaves(d: Diagram, kL: number, kR: number, cL: number, cR: number): Wave[] {
  if (d.kind !== 'triangular') return [{ type: 'rarefaction', tailSpeed: cL, headSpeed: cR, kLeft: kL, kRight: kR }]
  // Triangular: constant speed on each branch, so the fan is one or two contact lines.
  if (cL === cR) return [{ type: 'contact', speed: cL, kLeft: kL, kRight: kR }]
  const kc = criticalDensity(d)
  const waves: Wave[] = [
    { type: 'contact', speed: -d.w, kLeft: kL, kRight: kc },
    { type: 'contact', speed: d.vf, kLeft: kc, kRight: kR },
  ]
  return waves.filter((wave) => wave.kLeft !== wave.kRight)
}
