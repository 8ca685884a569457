import { describe, expect, it } from 'vitest';
import { CalcInputError } from '../../../../calc/errors.js';
import { createRk4Workspace, integrateRk4, locateEvent, rk4Step } from '../../../../calc/dynamics/integrator.js';

// Harmonic oscillator x'' = −x: closed form x = cos t, v = −sin t (any ODE text).
const oscillator = (_t: number, x: Float64Array, dx: Float64Array): void => {
  dx[0] = x[1] as number;
  dx[1] = -(x[0] as number);
};

describe('RK4 integrator', () => {
  it('follows the closed-form solution of the harmonic oscillator over one period', () => {
    // Global error of classical RK4 is O(h⁴) (Hairer, Nørsett & Wanner 1993, §II.3): ~T·h⁴/120 ≈ 5e-10 at h = 0.01.
    const end = integrateRk4(oscillator, [1, 0], 0, 2 * Math.PI, 0.01);
    expect(Math.abs((end[0] as number) - 1)).toBeLessThan(1e-8);
    expect(Math.abs(end[1] as number)).toBeLessThan(1e-8);
  });

  it('is fourth order: halving the step divides the error by about 16', () => {
    // Exponential decay x' = −2x, x(1) = e^−2 (closed form).
    const decay = (_t: number, x: Float64Array, dx: Float64Array): void => {
      dx[0] = -2 * (x[0] as number);
    };
    const error = (h: number) => Math.abs((integrateRk4(decay, [1], 0, 1, h)[0] as number) - Math.exp(-2));
    const ratio = error(0.05) / error(0.025);
    expect(ratio).toBeGreaterThan(14);
    expect(ratio).toBeLessThan(18);
  });

  it('takes one step into a separate output array without touching the input', () => {
    const x = Float64Array.from([1, 0]);
    const k1 = new Float64Array(2);
    oscillator(0, x, k1);
    const out = new Float64Array(2);
    rk4Step(oscillator, 0, x, k1, 0.1, createRk4Workspace(2), out);
    expect(Array.from(x)).toEqual([1, 0]);
    // Taylor series of cos 0.1 to h⁴ is what RK4 reproduces for a linear system: 1 − h²/2 + h⁴/24.
    expect(out[0]).toBeCloseTo(1 - 0.005 + 0.1 ** 4 / 24, 14);
  });

  it('throws instead of looping when the step count passes its guard', () => {
    expect(() => integrateRk4(oscillator, [1, 0], 0, 1, 1e-3, 100)).toThrow(new CalcInputError('stepS', 'gives 1000 steps, more than the limit of 100'));
    expect(() => integrateRk4(oscillator, [1, 0], 0, 1, 0)).toThrow('"stepS" must be positive');
  });
});

describe('event location', () => {
  it('finds the root of cos τ in [0, 2] at π/2 and returns the side past the event', () => {
    const root = locateEvent(Math.cos, 0, 1, 2, Math.cos(2), 1e-13);
    expect(Math.abs(root - Math.PI / 2)).toBeLessThan(1e-12);
    expect(Math.cos(root)).toBeLessThanOrEqual(0);
  });

  it('throws instead of looping when the iteration guard is reached', () => {
    expect(() => locateEvent(Math.cos, 0, 1, 2, Math.cos(2), 0, 3)).toThrow(
      '"stepS" is too coarse: a switching event could not be located within 67 iterations',
    );
  });

  it('closes in on an event where g jumps, as a floating terminal does when a square back-EMF reverses', () => {
    // Common practice, no source: a discontinuous g has its "root" at the jump; the located τ must
    // lie just past it, within the tolerance.
    // Lopsided values (regula falsi alone keeps its trial points near the small side and runs out of iterations).
    const jump = (tau: number): number => (tau < 0.7 ? 1 : -1000);
    const root = locateEvent(jump, 0, 1, 1, -1000, 1e-12);
    expect(root).toBeGreaterThanOrEqual(0.7);
    expect(root - 0.7).toBeLessThan(1e-12);
  });
});
