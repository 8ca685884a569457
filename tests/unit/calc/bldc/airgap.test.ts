import { describe, expect, it } from 'vitest';
import { carterCoefficient, loadLineFluxDensity, magnetThicknessFor, radialFieldHarmonics, fieldWaveform } from '../../../../calc/bldc/airgap.js';

describe('Carter coefficient (Carter 1926 in Pyrhönen et al. Eqs. (3.1)–(3.2))', () => {
  it('matches a hand calculation: τ_s = 10 mm, b_o = 2 mm, g = 1 mm → γ = (4/π)(π/4 − ln√2), k_C = 1.05918', () => {
    // Hand calculation of the published formula: x = b_o/2g = 1, γ = 0.558730, k_C = 10/(10 − 0.558730).
    expect(carterCoefficient(10e-3, 2e-3, 1e-3)).toBeCloseTo(1.05918, 5);
  });

  it('agrees with the simplified form k_C ≈ τ/(τ − b_o²/(5g + b_o)) within 1 % (Pyrhönen et al. §3.1, value from memory)', () => {
    for (const [tau, bo, g] of [[10, 2, 1], [20, 4, 1.5], [8, 3, 0.5], [30, 5, 3]] as const) {
      const approx = tau / (tau - bo ** 2 / (5 * g + bo));
      expect(Math.abs(carterCoefficient(tau, bo, g) / approx - 1)).toBeLessThan(0.01);
    }
  });

  it('is 1 for a closed slot and grows with the opening (limit case)', () => {
    expect(carterCoefficient(10e-3, 0, 1e-3)).toBe(1);
    expect(carterCoefficient(10e-3, 3e-3, 1e-3)).toBeGreaterThan(carterCoefficient(10e-3, 2e-3, 1e-3));
  });

  it('refuses an opening wider than the slot pitch', () => {
    expect(() => carterCoefficient(10e-3, 12e-3, 1e-3)).toThrow('"slotOpeningM" must be zero or more and less than the slot pitch');
    expect(() => carterCoefficient(0, 1e-3, 1e-3)).toThrow('"slotPitchM" must be positive');
  });
});

describe('magnet load line (Hanselman, Brushless Permanent Magnet Motor Design, ch. 4)', () => {
  it('gives B_g = k_l·B_r·l_m/(l_m + μ_rec·k_C·g): 0.95·1.2·5/(5 + 1.05·1.05·1) = 0.934043 T (hand calculation)', () => {
    expect(loadLineFluxDensity(1.2, 5e-3, 1.05, 1.05, 1e-3, 0.95)).toBeCloseTo(0.934043, 6);
  });

  it('round-trips magnet thickness → flux density → thickness', () => {
    const lm = magnetThicknessFor(0.8, 1.2, 1.05, 1.08, 0.8e-3, 0.95);
    expect(loadLineFluxDensity(1.2, lm, 1.05, 1.08, 0.8e-3, 0.95)).toBeCloseTo(0.8, 12);
    expect(magnetThicknessFor(1.2, 1.2, 1.05, 1.08, 0.8e-3, 0.95)).toBe(Number.POSITIVE_INFINITY);
  });
});

describe('analytical field (Zhu, Howe, Bolte, Ackermann 1993, radial magnetisation)', () => {
  it('tends to the load line when gap and magnet are thin against the radius: B̂_1 → (4/π)·B_r·l_m/(l_m + μ_r·g)·sin(α_p·π/2)', () => {
    // Physics limit (slotless 1-D magnetic circuit), tolerance 0.5 %.
    const R = 1;
    for (const polePairs of [1, 2, 20]) {
      const b = radialFieldHarmonics(polePairs, 1.2, 1.05, 0.8, R - 6e-3, R - 1e-3, R);
      const expected = (4 / Math.PI) * loadLineFluxDensity(1.2, 5e-3, 1.05, 1, 1e-3, 1) * Math.sin(0.4 * Math.PI);
      expect(Math.abs((b[0] ?? 0) / expected - 1)).toBeLessThan(0.005);
    }
  });

  it('has no 3rd harmonic for a 2/3 pole arc, and a flat top near the load-line value for a full arc', () => {
    const b = radialFieldHarmonics(2, 1.2, 1.05, 2 / 3, 0.04, 0.045, 0.046);
    expect(Math.abs(b[1] ?? 1)).toBeLessThan(1e-12);
    const full = fieldWaveform(radialFieldHarmonics(20, 1.2, 1.05, 1, 0.994, 0.999, 1), 360);
    expect(Math.abs((full[0] ?? 0) / loadLineFluxDensity(1.2, 5e-3, 1.05, 1, 1e-3, 1) - 1)).toBeLessThan(0.03);
  });

  it('weakens as the gap grows (monotonic)', () => {
    const near = radialFieldHarmonics(4, 1.2, 1.05, 0.8, 0.04, 0.045, 0.046)[0] ?? 0;
    const far = radialFieldHarmonics(4, 1.2, 1.05, 0.8, 0.04, 0.045, 0.048)[0] ?? 0;
    expect(far).toBeLessThan(near);
  });
});
