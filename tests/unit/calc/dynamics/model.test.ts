/**
 * The BLDC model's fused RK4 step and its branch-light trapezoid against their plain definitions:
 * the fused step must give what the generic RK4 of integrator.ts gives with the model's own
 * derivative (Hairer, Nørsett & Wanner 1993, Table II.1.2), and the back-EMF the model applies must
 * follow trapezoidShape at every angle and flat-top width.
 */
import { describe, expect, it } from 'vitest';
import { createRk4Workspace, rk4Step } from '../../../../calc/dynamics/integrator.js';
import { createLoadState } from '../../../../calc/dynamics/load.js';
import {
  AUX_EMF,
  AUX_SIZE,
  AUX_TERMINAL_V,
  AUX_TORQUE,
  BldcModel,
  STATE_SIZE,
  createBldcDerivative,
  halfTransitionFromFlatTop,
  trapezoidShape,
  type BldcModelConfig,
} from '../../../../calc/dynamics/model.js';
import { seededRandom } from '../../../support/random.js';

function config(options: { flatTopDeg: number; rectifier: boolean; legFactor: number[]; closed: number[]; quadratic: boolean }): BldcModelConfig {
  const { state } = createLoadState(options.quadratic ? { kind: 'quadratic', torqueNm: 2, atSpeedRpm: 3000 } : { kind: 'constant', torqueNm: 1.5 }, undefined);
  return {
    phaseResistanceOhm: 0.5,
    effectiveInductanceH: 2.5e-3,
    backEmfConstantVsPerRad: 0.25,
    polePairs: 2,
    totalInertiaKgM2: 2e-3,
    viscousFrictionNmsPerRad: 1e-4,
    halfTransition: halfTransitionFromFlatTop(options.flatTopDeg),
    shapeTable: null,
    legFactor: Float64Array.from(options.legFactor),
    closed: Float64Array.from(options.closed),
    load: state,
    rectifier: options.rectifier ? { peakLineV: Math.SQRT2 * 400, angularFrequency: 2 * Math.PI * 50, capacitanceF: 1e-3, sourceResistanceOhm: 0.05 } : null,
    aux: new Float64Array(AUX_SIZE),
  };
}

// Leg states of a six-step inverter: two legs switched, the third freewheeling or floating, all open.
// floatingAtZero: the floating phase carries exactly no current, as after its diode has blocked
// (then the model takes its two-leg equations on a stiff bus).
const LEG_STATES = [
  { legFactor: [1, 0, 0], closed: [1, 1, 0], floatingAtZero: false },
  { legFactor: [1, 0, 0], closed: [1, 1, 0], floatingAtZero: true },
  { legFactor: [0, 0.7, 0], closed: [0, 1, 1], floatingAtZero: true },
  { legFactor: [0, 0, 1], closed: [1, 0, 1], floatingAtZero: true },
  { legFactor: [0.6, 0, 1], closed: [1, 1, 1], floatingAtZero: false },
  { legFactor: [0, 1, 0], closed: [0, 1, 0], floatingAtZero: false },
  { legFactor: [0, 0, 0], closed: [0, 0, 0], floatingAtZero: false },
];

/** A random state for a leg state: currents summing to zero (the floating one at zero when asked), speed, angle, bus, energies. */
function randomState(random: () => number, legs: (typeof LEG_STATES)[number]): Float64Array<ArrayBuffer> {
  const x = new Float64Array(STATE_SIZE);
  x[0] = (random() - 0.5) * 40;
  x[1] = (random() - 0.5) * 40;
  x[2] = -(x[0] as number) - (x[1] as number);
  const floating = legs.closed.indexOf(0);
  if (legs.floatingAtZero && floating >= 0) {
    const other = (floating + 1) % 3;
    x[floating] = 0;
    x[(floating + 2) % 3] = -(x[other] as number);
  }
  x[3] = random() * 400;
  x[4] = random() * 50;
  x[5] = 250 + random() * 300;
  for (let k = 6; k < STATE_SIZE; k += 1) x[k] = random() * 100;
  return x;
}

describe('BldcModel.rk4Step (the simulation inner step)', () => {
  it('gives the generic RK4 step of the same derivative bit for bit: state, derivative and auxiliary outputs', () => {
    const random = seededRandom(20261202);
    let checked = 0;
    for (const legs of LEG_STATES) {
      for (const rectifier of [false, true]) {
        for (const flatTopDeg of [120, 150, 180]) {
          const model = new BldcModel(config({ flatTopDeg, rectifier, quadratic: rectifier, ...legs }));
          const reference = config({ flatTopDeg, rectifier, quadratic: rectifier, ...legs });
          const derivative = createBldcDerivative(reference);
          for (let trial = 0; trial < 20; trial += 1) {
            const x = randomState(random, legs);
            // Trial 0: at standstill just below zero angle, where phase a's position in its period rounds
            // to 1 (the wrap of the phase positions must follow derive(), or a square EMF flips sign there).
            if (trial === 0) {
              x[3] = 0;
              x[4] = -1e-20;
            }
            const t = random() * 0.1;
            const h = 1e-6 + random() * 1e-5;
            const k1 = new Float64Array(STATE_SIZE);
            derivative(t, x, k1);

            const expected = new Float64Array(STATE_SIZE);
            rk4Step(derivative, t, x, k1, h, createRk4Workspace(STATE_SIZE), expected);
            const expectedSlope = new Float64Array(STATE_SIZE);
            derivative(t + h, expected, expectedSlope);

            const out = new Float64Array(STATE_SIZE);
            const slope = new Float64Array(STATE_SIZE);
            const aux = new Float64Array(AUX_SIZE);
            model.time = t;
            model.stepS = h;
            model.rk4Step(x, k1, out, slope, aux);

            for (let k = 0; k < STATE_SIZE; k += 1) {
              expect(out[k]).toBe(expected[k] as number);
              expect(slope[k]).toBe(expectedSlope[k] as number);
            }
            for (let k = 0; k < AUX_SIZE; k += 1) expect(aux[k]).toBe(reference.aux[k] as number);
            expect(model.time).toBe(t + h);
            checked += 1;
          }
        }
      }
    }
    expect(checked).toBe(LEG_STATES.length * 2 * 3 * 20);
  });

  it('chained in its fields (startFrom, stepAhead, acceptStep) gives rk4Step bit for bit, with the floating terminal and the torque', () => {
    // What the simulation does between switching events must be exactly the step it takes otherwise
    // (common practice, no source: the two are the same arithmetic, so any difference is a mistake).
    const random = seededRandom(7);
    for (const legs of LEG_STATES) {
      // The last case starts a square-EMF motor without current at standstill just below zero angle: its
      // constant load holds the shaft there for the first steps, where phase a's position in its period
      // rounds to 1 on every stage.
      for (const [quadratic, rectifier, standstill] of [[false, false, false], [true, false, false], [true, true, false], [false, false, true]] as const) {
        const setup = config({ flatTopDeg: standstill ? 180 : 120 + 30 * random(), rectifier, quadratic, ...legs });
        const vectors = new BldcModel(setup);
        const fields = new BldcModel(setup);
        let x = randomState(random, legs);
        if (standstill) x.set([0, 0, 0, 0, -1e-20], 0);
        let k1 = new Float64Array(STATE_SIZE);
        vectors.evaluate(x, k1, new Float64Array(AUX_SIZE));
        fields.startFrom(x, k1);
        const floating = legs.closed.indexOf(0);
        const oneFloating = legs.closed.filter((c) => c === 0).length === 1;
        // The two-leg equations need a stiff bus and a floating phase at exactly zero current.
        expect(fields.twoLegs).toBe(oneFloating && (legs.floatingAtZero || standstill) && !rectifier);
        let out = new Float64Array(STATE_SIZE);
        let kOut = new Float64Array(STATE_SIZE);
        const aux = new Float64Array(AUX_SIZE);
        const h = 2e-6;
        for (let step = 0; step < 300; step += 1) {
          vectors.time = step * h;
          vectors.stepS = h;
          vectors.rk4Step(x, k1, out, kOut, aux);
          fields.time = step * h;
          fields.stepS = h;
          fields.stepAhead(false);
          const ends = [fields.endA, fields.endB, fields.endC, fields.endSpeed, fields.endAngle, fields.endVdc, fields.endIn, fields.endCopper, fields.endLoad, fields.endFriction];
          for (let k = 0; k < STATE_SIZE; k += 1) expect(ends[k]).toBe(out[k]);
          expect(fields.torque).toBe(aux[AUX_TORQUE]);
          if (oneFloating) expect(fields.openTerminalV).toBe(aux[AUX_TERMINAL_V + floating]);
          fields.acceptStep();
          [x, out] = [out, x];
          [k1, kOut] = [kOut, k1];
        }
        const written = new Float64Array(STATE_SIZE);
        fields.writeStart(written);
        expect(Array.from(written)).toEqual(Array.from(x));
      }
    }
  });
});

describe('the back-EMF the model applies', () => {
  it('follows trapezoidShape for phase a, b (−120°) and c (+120°) at every angle and flat-top width', () => {
    for (const flatTopDeg of [10, 30, 60, 90, 120, 150, 179, 180]) {
      const setup = config({ flatTopDeg, rectifier: false, quadratic: false, legFactor: [0, 0, 0], closed: [0, 0, 0] });
      const model = new BldcModel(setup);
      const halfTransition = halfTransitionFromFlatTop(flatTopDeg);
      const x = new Float64Array(STATE_SIZE);
      const dx = new Float64Array(STATE_SIZE);
      const speed = 100;
      x[3] = speed;
      x[5] = 300;
      // 2 pole pairs: one electrical period is π mechanical radians; 720 points over two periods, offset
      // from the trapezoid's corners (at a square wave's jump both sides are right, and rounding picks one).
      for (let index = 0; index < 720; index += 1) {
        const turns = (index + 0.37) / 360;
        const phase = turns % 1;
        x[4] = turns * Math.PI;
        model.evaluate(x, dx, setup.aux);
        const emf = (shift: number) => 0.25 * speed * trapezoidShape((((phase + shift) % 1) + 1) % 1, halfTransition);
        expect(setup.aux[AUX_EMF]).toBeCloseTo(emf(0), 9);
        expect(setup.aux[AUX_EMF + 1]).toBeCloseTo(emf(-1 / 3), 9);
        expect(setup.aux[AUX_EMF + 2]).toBeCloseTo(emf(1 / 3), 9);
      }
    }
  });

  it('gives zero torque and floats every terminal when all legs are open and no current flows', () => {
    const setup = config({ flatTopDeg: 120, rectifier: false, quadratic: false, legFactor: [0, 0, 0], closed: [0, 0, 0] });
    const model = new BldcModel(setup);
    const x = new Float64Array(STATE_SIZE);
    x[3] = 100;
    x[4] = 0.3;
    x[5] = 300;
    const dx = new Float64Array(STATE_SIZE);
    model.evaluate(x, dx, setup.aux);
    expect(setup.aux[AUX_TORQUE]).toBe(0);
    expect(dx[0]).toBe(0);
    // Mid-bus less the mean EMF, plus each phase's EMF (common practice, symmetric stray capacitance).
    const mean = ((setup.aux[AUX_EMF] as number) + (setup.aux[AUX_EMF + 1] as number) + (setup.aux[AUX_EMF + 2] as number)) / 3;
    expect(setup.aux[AUX_TERMINAL_V]).toBeCloseTo(150 - mean + (setup.aux[AUX_EMF] as number), 9);
  });
});
