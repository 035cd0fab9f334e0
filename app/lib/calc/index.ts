/**
 * Sternpost's calculation library: pure functions shared by the tablet (offline) and the server
 * (which re-checks every verdict it stores). No I/O, no framework imports. Every function takes
 * one object and returns a plain object; field names carry their unit; bad input throws a
 * CalcError naming the field.
 */
export { CalcError, isCalcError } from "./errors";
export { convert, dimensionOf, isUnit, units } from "./units";
export type { Unit, Dimension } from "./units";
export { validateHin } from "./hin";
export type { HinResult } from "./hin";

export { shaftRunout, runoutGrade, straighteningHistory } from "./runout";
export type { RunoutInput, RunoutResult, RunoutStation, RunoutGrade, StraighteningResult } from "./runout";
export { couplingFace, couplingRim, faceGaps, DEFAULT_MAX_IN_PER_IN_DIAMETER } from "./coupling";
export type { ClockGapsIn, CouplingFaceInput, CouplingFaceResult, CouplingRimResult } from "./coupling";
export { mountMoves } from "./mounts";
export type { MountMovesInput, MountMovesResult, MountMove } from "./mounts";
export { shimStack, DEFAULT_MAX_SHIM_PIECES } from "./shims";
export type { ShimStackResult } from "./shims";
export { couplingFit, isoFit, isoFitIn, fitCheck } from "./fits";
export type {
  IsoFitResult,
  IsoFitInchResult,
  FitCheckResult,
  FitKind,
  CouplingFitInput,
  CouplingFitResult,
} from "./fits";
export { keyForShaft, keyForShaftMm } from "./keys";
export type { KeyInchResult, KeyMetricResult } from "./keys";
export { propellerTaper, propellerTaperMm } from "./taper";
export type { PropellerTaperResult, PropellerTaperMmResult } from "./taper";
export { threadPitch } from "./threads";
export type { ThreadResult } from "./threads";
export { shaftDiameter, bearingSpacing } from "./shaft";
export type { ShaftDiameterResult, BearingSpacingResult } from "./shaft";
export { wireSize, awgCircularMils, conductorCircularMils, conductorCheck } from "./wire";
export type { WireSizeResult, ConductorCheckInput, ConductorCheckResult } from "./wire";
export { rawWaterFlow, speedRuns, tachPulses, heeledHeight, installationAngle } from "./trial";
export type { RawWaterFlowResult, SpeedRunsResult } from "./trial";
export { propSlip, seaTrialLoading, DEFAULT_RPM_PER_PITCH_IN } from "./prop";
export type { PropSlipResult, SeaTrialLoadingResult, LoadingVerdict } from "./prop";
export { exhaustInjection, exhaustBackPressure, DEFAULT_MIN_INJECTION_HEIGHT_IN } from "./exhaust";
export type { ExhaustInjectionResult, ExhaustBackPressureResult } from "./exhaust";
export { calculations, runCalc } from "./registry";
export type { CalcInput, CalcInputSpec, CalcDefinition, CalcOutcome, UnitSystem } from "./registry";
export { CAUTION_HOT_WORK } from "./define";
export { formatQuantity, roundForUnit, unitLabel } from "./precision";
export { presentOutcome } from "./present";
export type { PresentedOutcome, PresentedValue } from "./present";
