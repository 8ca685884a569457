import { describe, expect, it } from 'vitest';
import {
  DRIVE_DISPLACEMENT_POWER_FACTOR,
  driveInputPowerFactor,
  driveLossKw,
  driveReferenceLossFraction,
} from '../../../../calc/drives/losses.js';

describe('drive losses (IEC 61800-9-2 classes)', () => {
  it('orders the classes IE2 < IE1 < IE0 with IE2 below 75 % of the reference (IEC 61800-9-2 class bands, from memory)', () => {
    const ie2 = driveLossKw(7.5, 1, 'IE2');
    const ie1 = driveLossKw(7.5, 1, 'IE1');
    const ie0 = driveLossKw(7.5, 1, 'IE0');
    expect(ie2 / ie1).toBeLessThan(0.75);
    expect(ie0 / ie1).toBeGreaterThan(1.25);
  });

  it('has full-load losses of a few per cent, falling with size (common practice, no source)', () => {
    expect(driveReferenceLossFraction(0.75)).toBeCloseTo(0.0654, 3);
    expect(driveReferenceLossFraction(7.5)).toBeGreaterThan(driveReferenceLossFraction(75));
    expect(driveLossKw(7.5, 1, 'IE1') / 7.5).toBeCloseTo(driveReferenceLossFraction(7.5), 12);
  });

  it('keeps a fixed part at zero current and grows with current', () => {
    expect(driveLossKw(10, 0, 'IE1')).toBeGreaterThan(0);
    let previous = 0;
    for (let current = 0; current <= 1.25; current += 0.25) {
      const loss = driveLossKw(10, current, 'IE1');
      expect(loss).toBeGreaterThan(previous);
      previous = loss;
    }
  });

  it('shows the supply a power factor below its displacement factor that falls at light load (distortion, IEEE 519 practice)', () => {
    expect(driveInputPowerFactor(1)).toBeCloseTo(DRIVE_DISPLACEMENT_POWER_FACTOR / Math.sqrt(1 + 0.4 ** 2), 12);
    expect(driveInputPowerFactor(1)).toBeLessThan(DRIVE_DISPLACEMENT_POWER_FACTOR);
    expect(driveInputPowerFactor(0.25)).toBeLessThan(driveInputPowerFactor(1));
    expect(() => driveInputPowerFactor(2)).toThrow('"outputFraction" must be between 0 and 1.5');
    expect(() => driveReferenceLossFraction(0)).toThrow('"ratedPowerKw" must be positive');
  });
});
