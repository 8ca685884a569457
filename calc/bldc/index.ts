/**
 * calc/bldc — analytic design of a surface-PM brushless motor that fits an induction motor's frame.
 * Public entry points; see calc/README.md (section "BLDC design") for the method and sources.
 */
export { sizeBldc, resolveSpec, slotPoleCombinations, equivalentPoles, splitRatiosFor, SPLIT_RATIOS, CURRENT_DENSITY_FRACTIONS, type BldcInput, type BldcResult, type DesignSummary, type NearestFeasible } from './search.js';
export { sweep, SWEEPABLE_PARAMETERS, MAX_SWEEP_STEPS, type SweepRow, type SweepParameter } from './sweep.js';
export { windingLayout, type WindingLayout, type Coil, type SlotSide, type WindingHarmonic, type PhaseName } from './winding.js';
export { MAGNET_GRADES, LAMINATION_STEELS, DEFAULT_MAGNET, DEFAULT_STEEL, resolveMagnet, resolveSteel, magnetAtTemperature, type MagnetGrade, type LaminationSteel } from './materials.js';
export { frameLimits, listFrames, standardFrameFor, nextLargerFrame, type FrameLimits } from './frames.js';
export { carterCoefficient, loadLineFluxDensity, magnetThicknessFor, radialFieldHarmonics } from './airgap.js';
export { evaluateDesign, magneticDesign, lossesAt, partLoad, PART_LOAD_FRACTIONS, type BldcDesign, type BldcSpec, type Candidate, type Constraint } from './design.js';
export { DEFAULT_TARGETS, type DesignTargets, type Objective, type Cooling, type DriveKind } from './defaults.js';
export { driveLossModel, driveLossW, driveInputPowerFactor } from './drive.js';
export { demagnetisationMargin, magnetWorkingPoint } from './demagnetisation.js';
export { runWindingCommand, runSizeBldcCommand, runSweepCommand, sizeBldcInputSchema, windingInputSchema, sweepInputSchema } from './commands.js';
