/**
 * Fixed-step classical Runge–Kutta (RK4) on Float64Array states, and event location inside a step
 * by the Illinois variant of regula falsi. Nothing here allocates per step.
 *
 * References:
 * [1] E. Hairer, S. P. Nørsett, G. Wanner, Solving Ordinary Differential Equations I, 2nd ed.,
 *     Springer, 1993, §II.1 (classical RK4) and §II.6 (dense output and event location).
 * [2] W. H. Press et al., Numerical Recipes, 3rd ed., 2007, §17.1 (RK4) and §9.2 (false position).
 * [3] M. Dowell, P. Jarratt, "A modified regula falsi method for computing the root of an
 *     equation", BIT 11, 1971, 168–174 (the Illinois algorithm).
 */
import { CalcInputError } from '../errors.js';
import type { Derivative } from './model.js';

/** Largest number of steps `integrateRk4` takes before it throws instead of looping on. */
export const DEFAULT_MAX_STEPS = 50_000_000;
/** Iterations after which event location gives up and throws. */
export const MAX_EVENT_ITERATIONS = 100;
/** Bisections after them, for an event function that jumps at its root [-] (2^-64 of the bracket: below any tolerance). */
const MAX_BISECTIONS = 64;

/** Stage and scratch arrays for RK4 on a state of `size` numbers, made once per run. */
export interface Rk4Workspace {
  k2: Float64Array;
  k3: Float64Array;
  k4: Float64Array;
  stage: Float64Array;
}

/** Allocates the RK4 workspace for a state of `size` numbers. */
export function createRk4Workspace(size: number): Rk4Workspace {
  return { k2: new Float64Array(size), k3: new Float64Array(size), k4: new Float64Array(size), stage: new Float64Array(size) };
}

/**
 * One classical RK4 step ([1] Table II.1.2, [2] Eq. (17.1.3)):
 *   k1 = f(t, x), k2 = f(t + h/2, x + h/2·k1), k3 = f(t + h/2, x + h/2·k2), k4 = f(t + h, x + h·k3),
 *   x(t + h) = x + h/6·(k1 + 2k2 + 2k3 + k4).
 * @param f right-hand side
 * @param t time at the start [s]
 * @param x state at the start (not changed)
 * @param k1 f(t, x), computed by the caller (so it can be reused from the previous step's end)
 * @param h step [s]
 * @param work stage arrays
 * @param out state at t + h (may not alias x)
 */
export function rk4Step(f: Derivative, t: number, x: Float64Array, k1: Float64Array, h: number, work: Rk4Workspace, out: Float64Array): void {
  const size = x.length;
  const { k2, k3, k4, stage } = work;
  const half = 0.5 * h;
  for (let i = 0; i < size; i++) stage[i] = (x[i] as number) + half * (k1[i] as number);
  f(t + half, stage, k2);
  for (let i = 0; i < size; i++) stage[i] = (x[i] as number) + half * (k2[i] as number);
  f(t + half, stage, k3);
  for (let i = 0; i < size; i++) stage[i] = (x[i] as number) + h * (k3[i] as number);
  f(t + h, stage, k4);
  const sixth = h / 6;
  for (let i = 0; i < size; i++) {
    out[i] = (x[i] as number) + sixth * ((k1[i] as number) + 2 * (k2[i] as number) + 2 * (k3[i] as number) + (k4[i] as number));
  }
}

/**
 * Integrates dx/dt = f(t, x) from t0 to t1 with fixed RK4 steps (the last one shortened to land on t1).
 * @param f right-hand side
 * @param initial state at t0 (copied)
 * @param t0 start [s]
 * @param t1 end [s], after t0
 * @param stepS step [s], positive
 * @param maxSteps guard [-]: more steps than this throws CalcInputError on "stepS" instead of looping
 * @returns state at t1
 */
export function integrateRk4(f: Derivative, initial: ArrayLike<number>, t0: number, t1: number, stepS: number, maxSteps = DEFAULT_MAX_STEPS): Float64Array {
  if (!Number.isFinite(stepS) || stepS <= 0) throw new CalcInputError('stepS', 'must be positive');
  if (!Number.isFinite(t1 - t0) || t1 < t0) throw new CalcInputError('t1', 'must be a finite time not before t0');
  const steps = Math.ceil((t1 - t0) / stepS - 1e-9);
  if (steps > maxSteps) throw new CalcInputError('stepS', `gives ${steps} steps, more than the limit of ${maxSteps}`);
  let x = Float64Array.from(initial);
  let next = new Float64Array(x.length);
  const k1 = new Float64Array(x.length);
  const work = createRk4Workspace(x.length);
  for (let n = 0; n < steps; n++) {
    const t = t0 + n * stepS;
    const h = Math.min(stepS, t1 - t);
    f(t, x, k1);
    rk4Step(f, t, x, k1, h, work, next);
    const swap = x;
    x = next;
    next = swap;
  }
  return x;
}

/**
 * Locates the root of a scalar event function g(τ) bracketed by g(a) > 0 ≥ g(b) by the Illinois
 * variant of regula falsi ([3]; [2] §9.2), finishing by bisection if that has not closed the bracket
 * after maxIterations. Returns the end of the final bracket (where g ≤ 0), so the event has happened
 * at the returned τ.
 * @param g event function of the step fraction τ [s]
 * @param a left end [s] with g(a) = ga > 0
 * @param ga g(a)
 * @param b right end [s] with g(b) = gb ≤ 0
 * @param gb g(b)
 * @param tolerance bracket width at which to stop [s]
 * @param maxIterations guard: throws CalcInputError on "stepS" instead of looping
 */
export function locateEvent(g: (tau: number) => number, a: number, ga: number, b: number, gb: number, tolerance: number, maxIterations = MAX_EVENT_ITERATIONS): number {
  let left = a;
  let right = b;
  let gLeft = ga;
  let gRight = gb;
  let side = 0;
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    if (right - left <= tolerance) return right;
    let tau = right - (gRight * (right - left)) / (gRight - gLeft);
    // Keep the trial strictly inside the bracket (a flat g could put it on an end).
    if (!(tau > left && tau < right)) tau = 0.5 * (left + right);
    const value = g(tau);
    if (value > 0) {
      left = tau;
      gLeft = value;
      if (side === 1) gRight *= 0.5;
      side = 1;
    } else {
      right = tau;
      gRight = value;
      if (value === 0) return right;
      if (side === -1) gLeft *= 0.5;
      side = -1;
    }
  }
  // Regula falsi crawls when g jumps at the event (a floating terminal when a square back-EMF
  // reverses): bisection then closes the bracket whatever g does, 1 bit per evaluation.
  for (let iteration = 0; iteration < MAX_BISECTIONS; iteration++) {
    if (right - left <= tolerance) return right;
    const tau = 0.5 * (left + right);
    const value = g(tau);
    if (value > 0) left = tau;
    else {
      right = tau;
      if (value === 0) return right;
    }
  }
  throw new CalcInputError('stepS', `is too coarse: a switching event could not be located within ${maxIterations + MAX_BISECTIONS} iterations`);
}
