/**
 * Air gap of a surface-mounted permanent-magnet rotor: Carter's coefficient, the magnet load line
 * and the analytical radial field over a pole pair.
 *
 * References:
 * [1] F. W. Carter, "The magnetic field of the dynamo-electric machine", J. IEE 64, 1926; in the form
 *     of J. Pyrhönen et al., Design of Rotating Electrical Machines, 2nd ed., 2014, Eqs. (3.1)–(3.3).
 * [2] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 4 (load line
 *     B_g = k_l·B_r·l_m/(l_m + μ_rec·k_C·g)).
 * [3] Z. Q. Zhu, D. Howe, E. Bolte, B. Ackermann, "Instantaneous magnetic field distribution in
 *     brushless permanent magnet dc motors, Part I: Open-circuit field", IEEE Trans. Magn. 29(1),
 *     1993, pp. 124–135; and Z. Q. Zhu, D. Howe, C. C. Chan, "Improved analytical model for
 *     predicting the magnetic field distribution in brushless permanent-magnet machines", IEEE
 *     Trans. Magn. 38(1), 2002 (radial magnetisation, internal rotor, slotless; slotting by a
 *     Carter-enlarged gap).
 */
import { CalcInputError } from '../errors.js';

/**
 * Carter's coefficient of a slotted surface.
 * k_C = τ_s / (τ_s − γ·g), γ = (4/π)·[(b_o/2g)·atan(b_o/2g) − ln√(1 + (b_o/2g)²)]  — Eq. (3.1)–(3.2) of [1].
 * @param slotPitchM slot pitch at the bore τ_s [m]
 * @param slotOpeningM slot opening b_o [m]
 * @param magneticGapM magnetic gap g [m]; for surface magnets g + l_m/μ_rec (REFERENCES.md §7)
 * @returns k_C [-], ≥ 1
 */
export function carterCoefficient(slotPitchM: number, slotOpeningM: number, magneticGapM: number): number {
  if (!(slotPitchM > 0)) throw new CalcInputError('slotPitchM', 'must be positive');
  if (!(magneticGapM > 0)) throw new CalcInputError('magneticGapM', 'must be positive');
  if (!(slotOpeningM >= 0) || slotOpeningM >= slotPitchM) throw new CalcInputError('slotOpeningM', 'must be zero or more and less than the slot pitch');
  const x = slotOpeningM / (2 * magneticGapM);
  const gamma = (4 / Math.PI) * (x * Math.atan(x) - Math.log(Math.sqrt(1 + x * x))); // Eq. (3.2) of [1]
  return slotPitchM / (slotPitchM - gamma * magneticGapM); // Eq. (3.1) of [1]
}

/**
 * Air-gap flux density over a surface magnet from its load line:
 * B_g = k_l·B_r·l_m / (l_m + μ_rec·k_C·g)  — [2], ch. 4.
 * @param remanenceT B_r at the magnet temperature [T]
 * @param magnetThicknessM l_m [m]
 * @param recoilPermeability μ_rec [-]
 * @param carter k_C [-]
 * @param airgapM mechanical gap g [m]
 * @param leakageFactor k_l [-], 0.9–1 (flux that crosses the gap / flux leaving the magnet)
 * @returns B_g [T]
 */
export function loadLineFluxDensity(remanenceT: number, magnetThicknessM: number, recoilPermeability: number, carter: number, airgapM: number, leakageFactor: number): number {
  return (leakageFactor * remanenceT * magnetThicknessM) / (magnetThicknessM + recoilPermeability * carter * airgapM);
}

/**
 * Magnet thickness that gives an air-gap flux density on the load line (the inverse of
 * loadLineFluxDensity): l_m = μ_rec·k_C·g·B_g / (k_l·B_r − B_g).
 * @returns l_m [m]; Infinity when B_g ≥ k_l·B_r (unreachable)
 */
export function magnetThicknessFor(fluxDensityT: number, remanenceT: number, recoilPermeability: number, carter: number, airgapM: number, leakageFactor: number): number {
  const headroom = leakageFactor * remanenceT - fluxDensityT;
  if (headroom <= 0) return Number.POSITIVE_INFINITY;
  return (recoilPermeability * carter * airgapM * fluxDensityT) / headroom;
}

/** Odd space harmonics (of the pole pitch) kept in the field model [-]. */
export const FIELD_HARMONIC_COUNT = 20;

/**
 * Harmonic amplitudes of the radial air-gap flux density of a radially magnetised surface-magnet
 * rotor at the stator bore, slotless with the gap enlarged by Carter's coefficient [3].
 * For n odd, ν = n·p (mechanical order):
 *   M_n = 2·B_r·α_p·sin(nπα_p/2)/(nπα_p/2)
 *   K_n = (M_n/μ_r)·ν/(ν²−1)·[(ν−1) + 2(R_r/R_m)^{ν+1} − (ν+1)(R_r/R_m)^{2ν}]
 *         / [((μ_r+1)/μ_r)(1 − (R_r/R_s)^{2ν}) − ((μ_r−1)/μ_r)((R_m/R_s)^{2ν} − (R_r/R_m)^{2ν})]
 *   B_n(R_s) = 2·K_n·(R_m/R_s)^{ν+1};  for ν = 1 the limit form of [3] (logarithmic term).
 * @param polePairs p [-]
 * @param remanenceT B_r [T]
 * @param recoilPermeability μ_r [-]
 * @param poleArcFraction α_p [-], 0 < α_p ≤ 1
 * @param rotorCoreRadiusM R_r, radius under the magnets [m]
 * @param magnetRadiusM R_m, magnet outer radius [m]
 * @param statorRadiusM R_s, effective stator bore radius (R_m + k_C·g) [m]
 * @returns amplitudes B_n [T] for n = 1, 3, 5, … (index i → n = 2i+1), cosine series about the d-axis
 */
export function radialFieldHarmonics(polePairs: number, remanenceT: number, recoilPermeability: number, poleArcFraction: number, rotorCoreRadiusM: number, magnetRadiusM: number, statorRadiusM: number): number[] {
  const mu = recoilPermeability;
  const rr = rotorCoreRadiusM;
  const rm = magnetRadiusM;
  const rs = statorRadiusM;
  const out: number[] = [];
  for (let i = 0; i < FIELD_HARMONIC_COUNT; i += 1) {
    const n = 2 * i + 1;
    const arg = (n * Math.PI * poleArcFraction) / 2;
    const mn = (2 * remanenceT * poleArcFraction * Math.sin(arg)) / arg; // M_n, radial magnetisation [3]
    const v = n * polePairs;
    const den = ((mu + 1) / mu) * (1 - (rr / rs) ** (2 * v)) - ((mu - 1) / mu) * ((rm / rs) ** (2 * v) - (rr / rm) ** (2 * v));
    let k: number;
    if (v === 1) {
      // ν = 1 (two-pole rotor): limit form of [3] with the logarithmic term.
      k = ((mn / (2 * mu)) * ((rm / rs) ** 2 - (rr / rs) ** 2 + (rr / rs) ** 2 * Math.log((rm / rr) ** 2))) / den;
      out.push(2 * k);
    } else {
      const num = v - 1 + 2 * (rr / rm) ** (v + 1) - (v + 1) * (rr / rm) ** (2 * v);
      k = ((mn / mu) * (v / (v * v - 1)) * num) / den;
      out.push(2 * k * (rm / rs) ** (v + 1));
    }
  }
  return out;
}

/**
 * Evaluates a cosine series Σ B_n·cos(n·θ_e) (n odd) on equally spaced electrical angles.
 * @param harmonics amplitudes for n = 1, 3, 5, … [T]
 * @param samples number of points over one electrical period [-]
 * @returns values [T] at θ_e = 2π·k/samples
 */
export function fieldWaveform(harmonics: readonly number[], samples: number): number[] {
  const out = new Array<number>(samples).fill(0);
  for (let k = 0; k < samples; k += 1) {
    const theta = (2 * Math.PI * k) / samples;
    let sum = 0;
    harmonics.forEach((b, i) => {
      sum += b * Math.cos((2 * i + 1) * theta);
    });
    out[k] = sum;
  }
  return out;
}
