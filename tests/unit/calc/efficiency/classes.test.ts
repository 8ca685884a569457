import { describe, expect, it } from 'vitest';
import {
  IE_CLASSES,
  iecClassEfficiency,
  ie5FromIe4EfficiencyPct,
  nemaNominalEfficiencyPct,
  roundHalfUpTenth,
  unknownClassEfficiency,
  type IeClass,
  type Poles,
} from '../../../../calc/efficiency/classes.js';

const KW = [0.75, 1.1, 1.5, 2.2, 3, 4, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90, 110, 132, 160, 200];

/**
 * IEC 60034-30-1:2014 Table 2 values at 50 Hz (as reproduced in REFERENCES.md section 1, computed there
 * from the EU 2019/1781 / UK SI 2021/745 Sch. 16 Table 28 coefficients and rounded half-up): columns
 * 2, 4, 6, 8 poles for each kW of KW. IE1 6/8 poles are not tabulated there (null).
 */
const TABLE: Record<Exclude<IeClass, 'IE5'>, (readonly (number | null)[])[]> = {
  IE1: [[72.1, 72.1, null, null], [75.0, 75.0, null, null], [77.2, 77.2, null, null], [79.7, 79.7, null, null], [81.5, 81.5, null, null], [83.1, 83.1, null, null], [84.7, 84.7, null, null], [86.0, 86.0, null, null], [87.6, 87.6, null, null], [88.7, 88.7, null, null], [89.3, 89.3, null, null], [89.9, 89.9, null, null], [90.7, 90.7, null, null], [91.2, 91.2, null, null], [91.7, 91.7, null, null], [92.1, 92.1, null, null], [92.7, 92.7, null, null], [93.0, 93.0, null, null], [93.3, 93.3, null, null], [93.5, 93.5, null, null], [93.8, 93.8, null, null], [94.0, 94.0, null, null]],
  IE2: [[77.4, 79.6, 75.9, 66.2], [79.6, 81.4, 78.1, 70.8], [81.3, 82.8, 79.8, 74.1], [83.2, 84.3, 81.8, 77.6], [84.6, 85.5, 83.3, 80.0], [85.8, 86.6, 84.6, 81.9], [87.0, 87.7, 86.0, 83.8], [88.1, 88.7, 87.2, 85.3], [89.4, 89.8, 88.7, 86.9], [90.3, 90.6, 89.7, 88.0], [90.9, 91.2, 90.4, 88.6], [91.3, 91.6, 90.9, 89.1], [92.0, 92.3, 91.7, 89.8], [92.5, 92.7, 92.2, 90.3], [92.9, 93.1, 92.7, 90.7], [93.2, 93.5, 93.1, 91.0], [93.8, 94.0, 93.7, 91.6], [94.1, 94.2, 94.0, 91.9], [94.3, 94.5, 94.3, 92.3], [94.6, 94.7, 94.6, 92.6], [94.8, 94.9, 94.8, 93.0], [95.0, 95.1, 95.0, 93.5]],
  IE3: [[80.7, 82.5, 78.9, 75.0], [82.7, 84.1, 81.0, 77.7], [84.2, 85.3, 82.5, 79.7], [85.9, 86.7, 84.3, 81.9], [87.1, 87.7, 85.6, 83.5], [88.1, 88.6, 86.8, 84.8], [89.2, 89.6, 88.0, 86.2], [90.1, 90.4, 89.1, 87.3], [91.2, 91.4, 90.3, 88.6], [91.9, 92.1, 91.2, 89.6], [92.4, 92.6, 91.7, 90.1], [92.7, 93.0, 92.2, 90.6], [93.3, 93.6, 92.9, 91.3], [93.7, 93.9, 93.3, 91.8], [94.0, 94.2, 93.7, 92.2], [94.3, 94.6, 94.1, 92.5], [94.7, 95.0, 94.6, 93.1], [95.0, 95.2, 94.9, 93.4], [95.2, 95.4, 95.1, 93.7], [95.4, 95.6, 95.4, 94.0], [95.6, 95.8, 95.6, 94.3], [95.8, 96.0, 95.8, 94.6]],
  IE4: [[83.5, 85.7, 82.7, 78.4], [85.2, 87.2, 84.5, 80.8], [86.5, 88.2, 85.9, 82.6], [88.0, 89.5, 87.4, 84.5], [89.1, 90.4, 88.6, 85.9], [90.0, 91.1, 89.5, 87.1], [90.9, 91.9, 90.5, 88.3], [91.7, 92.6, 91.3, 89.3], [92.6, 93.3, 92.3, 90.4], [93.3, 93.9, 92.9, 91.2], [93.7, 94.2, 93.4, 91.7], [94.0, 94.5, 93.7, 92.1], [94.5, 94.9, 94.2, 92.7], [94.8, 95.2, 94.5, 93.1], [95.0, 95.4, 94.8, 93.4], [95.3, 95.7, 95.1, 93.7], [95.6, 96.0, 95.4, 94.2], [95.8, 96.1, 95.6, 94.4], [96.0, 96.3, 95.8, 94.7], [96.2, 96.4, 96.0, 94.9], [96.3, 96.6, 96.2, 95.1], [96.5, 96.7, 96.3, 95.4]],
};
const POLE_COLUMNS: Poles[] = [2, 4, 6, 8];

describe('IEC 60034-30-1 classes at 50 Hz', () => {
  const cases: [IeClass, number, Poles, number][] = [];
  for (const ieClass of ['IE1', 'IE2', 'IE3', 'IE4'] as const) {
    TABLE[ieClass].forEach((row, rowIndex) =>
      row.forEach((value, column) => {
        if (value !== null) cases.push([ieClass, KW[rowIndex]!, POLE_COLUMNS[column]!, value]);
      }),
    );
  }

  it.each(cases)('%s %s kW %s poles = %s % (IEC 60034-30-1 Table 2 / EU 2019/1781 Table 28, exact to 0.1 %)', (ieClass, kw, poles, expected) => {
    expect(iecClassEfficiency(kw, poles, 50, ieClass).efficiencyPct).toBe(expected);
  });

  it('rounds the unrounded value once, half-up: the values that sit within 0.002 of a boundary (REFERENCES.md section 1)', () => {
    // Unrounded 93.2489, 95.0481, 87.2495, 92.2486, 84.5483: rounding to 0.01 first would give .3/.1/.3/.3/.6.
    expect(iecClassEfficiency(55, 2, 50, 'IE2').efficiencyPct).toBe(93.2); // Table 28 IE2 2p 55 kW
    expect(iecClassEfficiency(200, 2, 50, 'IE2').efficiencyPct).toBe(95.0); // Table 28 IE2 2p 200 kW
    expect(iecClassEfficiency(7.5, 6, 50, 'IE2').efficiencyPct).toBe(87.2); // Table 28 IE2 6p 7.5 kW
    expect(iecClassEfficiency(37, 6, 50, 'IE2').efficiencyPct).toBe(92.2); // Table 28 IE2 6p 37 kW
    expect(iecClassEfficiency(1.1, 6, 50, 'IE4').efficiencyPct).toBe(84.5); // Table 28 IE4 6p 1.1 kW
    expect(roundHalfUpTenth(86.05)).toBe(86.1); // half-up, and the binary 86.0499999… is not rounded down
  });

  it('uses Table 27 below 0.75 kW (IEC 60034-30-1 Table 2, 4 poles; values from memory)', () => {
    expect([0.12, 0.18, 0.25, 0.37, 0.55].map((kw) => iecClassEfficiency(kw, 4, 50, 'IE3').efficiencyPct)).toEqual([64.8, 69.9, 73.5, 77.3, 80.8]);
    expect([0.12, 0.18, 0.25, 0.37, 0.55].map((kw) => iecClassEfficiency(kw, 4, 50, 'IE2').efficiencyPct)).toEqual([59.1, 64.7, 68.5, 72.7, 77.1]);
  });

  it('interpolates ratings between the tabulated ones with the logarithmic formula, between its neighbours', () => {
    const at = iecClassEfficiency(12, 4, 50, 'IE3').efficiencyPct; // between 11 kW (91.4) and 15 kW (92.1)
    expect(at).toBeGreaterThan(91.4);
    expect(at).toBeLessThan(92.1);
    expect(iecClassEfficiency(12, 4, 50, 'IE3').source).toContain('Table 28');
  });

  it('holds the 200 kW value up to 1000 kW (IEC 60034-30-1, value from memory)', () => {
    expect(iecClassEfficiency(500, 4, 50, 'IE3').efficiencyPct).toBe(96.0);
    expect(iecClassEfficiency(1000, 2, 50, 'IE4').efficiencyPct).toBe(96.5);
  });

  it('derives IE1 for 6 poles close to the published values (IEC 60034-30-1 IE1 6-pole, REFERENCES.md section 1)', () => {
    const published: [number, number][] = [[0.75, 70.0], [1.1, 72.9], [1.5, 75.2], [2.2, 77.7], [3, 79.7], [4, 81.4], [5.5, 83.1], [7.5, 84.7], [11, 86.4]];
    for (const [kw, value] of published) expect(iecClassEfficiency(kw, 6, 50, 'IE1').efficiencyPct).toBeCloseTo(value, 5);
    // Between the published points the ratio is interpolated: stays between its neighbours.
    const between = iecClassEfficiency(9, 6, 50, 'IE1').efficiencyPct;
    expect(between).toBeGreaterThan(84.7);
    expect(between).toBeLessThan(86.4);
  });
});

describe('IE5 and the class order', () => {
  it('gives IE5 20 % lower losses than IE4 (IEC TS 60034-30-2 working rule, from memory)', () => {
    const ie4 = iecClassEfficiency(11, 4, 50, 'IE4').efficiencyPct; // 93.3, Table 28
    const ie5 = iecClassEfficiency(11, 4, 50, 'IE5');
    expect(ie5.efficiencyPct).toBe(roundHalfUpTenth(ie5FromIe4EfficiencyPct(ie4)));
    expect(ie5.efficiencyPct).toBe(94.6); // 1/(1 + 0.8·(1/0.933 − 1)) = 0.9458
    expect(ie5.source).toContain('20 % lower losses');
    expect((100 / ie5FromIe4EfficiencyPct(90) - 1) / (100 / 90 - 1)).toBeCloseTo(0.8, 12);
  });

  it('orders IE1 < IE2 < IE3 < IE4 < IE5 for every rating, pole number and frequency (physics of the class scheme)', () => {
    const powers = [0.12, 0.2, 0.37, 0.55, 0.6, 0.75, 1, 2, 3.7, 5, 9, 18.5, 30, 50, 90, 150, 160, 250, 1000];
    for (const frequencyHz of [50, 60]) {
      for (const poles of POLE_COLUMNS) {
        for (const kw of powers) {
          const values = IE_CLASSES.map((ieClass) => iecClassEfficiency(kw, poles, frequencyHz, ieClass).efficiencyPct);
          for (let index = 1; index < values.length; index += 1) {
            expect(values[index]!, `${kw} kW ${poles}p ${frequencyHz} Hz ${IE_CLASSES[index]}`).toBeGreaterThan(values[index - 1]!);
          }
          expect(values[4]!).toBeLessThan(100);
        }
      }
    }
  });

  it('puts an old motor of unknown class below IE1 and says so', () => {
    const unknown = unknownClassEfficiency(7.5, 4, 50);
    expect(unknown.efficiencyPct).toBeLessThan(86.0); // IE1 7.5 kW 4p, Table 2
    expect(unknown.efficiencyPct).toBe(84.2); // losses 1.15 × IE1's (common practice, no source)
    expect(unknown.source).toContain('below IE1');
  });
});

describe('60 Hz and NEMA MG 1', () => {
  /** NEMA Premium, MG 1 Table 12-12 = 10 CFR 431.25 (REFERENCES.md 2.1), enclosed 4 poles by hp. */
  const premiumEnclosed4: [number, number][] = [[1, 85.5], [1.5, 86.5], [2, 86.5], [3, 89.5], [5, 89.5], [7.5, 91.7], [10, 91.7], [15, 92.4], [20, 93.0], [25, 93.6], [30, 93.6], [40, 94.1], [50, 94.5], [60, 95.0], [75, 95.4], [100, 95.4], [125, 95.4], [150, 95.8], [200, 96.2]];

  it.each(premiumEnclosed4)('NEMA Premium %s hp 4p enclosed = %s % (NEMA MG 1 Table 12-12)', (hp, value) => {
    expect(nemaNominalEfficiencyPct(hp, 4, 'enclosed', 'nema-premium').efficiencyPct).toBe(value);
  });

  it('reads the other NEMA Premium and EPAct columns (MG 1 Tables 12-12 and 12-11, REFERENCES.md 2.1–2.2)', () => {
    expect(nemaNominalEfficiencyPct(1, 2, 'enclosed', 'nema-premium').efficiencyPct).toBe(77.0);
    expect(nemaNominalEfficiencyPct(200, 6, 'open', 'nema-premium').efficiencyPct).toBe(95.4);
    expect(nemaNominalEfficiencyPct(10, 8, 'enclosed', 'nema-premium').efficiencyPct).toBe(89.5); // WAC 51-11C-40508
    expect(nemaNominalEfficiencyPct(30, 8, 'open', 'nema-premium').efficiencyPct).toBe(91.7);
    expect(nemaNominalEfficiencyPct(10, 4, 'enclosed', 'epact').efficiencyPct).toBe(89.5); // 10 CFR 431.25(a)
    expect(nemaNominalEfficiencyPct(200, 2, 'enclosed', 'epact').efficiencyPct).toBe(95.0);
    expect(nemaNominalEfficiencyPct(1, 6, 'open', 'epact').efficiencyPct).toBe(80.0);
  });

  it('applies the midpoint rule between listed ratings (10 CFR 431.25(b))', () => {
    expect(nemaNominalEfficiencyPct(12.4, 4, 'enclosed', 'nema-premium').efficiencyPct).toBe(91.7); // below 12.5 → 10 hp
    expect(nemaNominalEfficiencyPct(12.5, 4, 'enclosed', 'nema-premium').efficiencyPct).toBe(92.4); // at midpoint → 15 hp
  });

  it('takes IE3 at 60 Hz as the NEMA Premium level and IE2 as the EPAct level (IEC 60034-30-1 60 Hz tables)', () => {
    expect(iecClassEfficiency(7.5, 4, 60, 'IE3').efficiencyPct).toBe(91.7); // 10 hp Premium, enclosed
    expect(iecClassEfficiency(7.5, 4, 60, 'IE2').efficiencyPct).toBe(89.5); // 10 hp EPAct, enclosed
    expect(iecClassEfficiency(150, 2, 60, 'IE3').efficiencyPct).toBe(95.4); // 200 hp Premium
    expect(iecClassEfficiency(11, 8, 60, 'IE3').source).toContain('50 Hz value'); // 8 poles: 60 Hz table not at hand
    expect(iecClassEfficiency(7.5, 4, 60, 'IE4').source).toContain('approximated');
  });

  it('refuses ratings and poles outside the tables with a clear error', () => {
    expect(() => nemaNominalEfficiencyPct(40, 8, 'enclosed', 'nema-premium')).toThrow('"ratedPowerHp" has no nema-premium value for 40 hp, 8 poles, enclosed');
    expect(() => nemaNominalEfficiencyPct(5, 8, 'enclosed', 'epact')).toThrow('"poles" has no epact value for 8 poles');
    expect(() => nemaNominalEfficiencyPct(1, 2, 'open', 'epact')).toThrow('"ratedPowerHp" has no epact value for 1 hp, 2 poles, open');
    expect(() => nemaNominalEfficiencyPct(0.5, 4, 'open', 'epact')).toThrow('"ratedPowerHp" must be between 1 and 200');
  });
});

describe('bad input', () => {
  it('names the field and the rule', () => {
    expect(() => iecClassEfficiency(-1, 4, 50, 'IE3')).toThrow('"ratedPowerKw" must be between 0.12 and 1000');
    expect(() => iecClassEfficiency(1001, 4, 50, 'IE3')).toThrow('"ratedPowerKw" must be between 0.12 and 1000');
    expect(() => iecClassEfficiency(11, 3 as Poles, 50, 'IE3')).toThrow('"poles" must be 2, 4, 6 or 8');
    expect(() => iecClassEfficiency(11, 4, 45, 'IE3')).toThrow('"frequencyHz" must be 50 or 60');
    expect(() => iecClassEfficiency(11, 4, 50, 'IE9' as IeClass)).toThrow('"efficiencyClass" must be one of IE1, IE2, IE3, IE4, IE5');
    expect(() => unknownClassEfficiency(11, 4, 50, 0.5)).toThrow('"unknownClassLossFactor" must be between 1 and 3');
  });
});
