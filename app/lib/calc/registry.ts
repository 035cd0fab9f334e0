import { couplingFaceCalc, couplingRimCalc } from "./coupling";
import type { CalcDefinition, CalcInput, CalcOutcome } from "./define";
import { runDefinition } from "./run";
import { exhaustBackPressureCalc, exhaustInjectionCalc } from "./exhaust";
import { couplingFitCalc, isoFitCalc } from "./fits";
import { validateHinCalc } from "./hin";
import { mountMovesCalc } from "./mounts";
import { propSlipCalc, seaTrialLoadingCalc } from "./prop";
import { shaftRunoutCalc } from "./runout";
import { bearingSpacingCalc, shaftDiameterCalc } from "./shaft";
import { keyForShaftCalc, keyForShaftMmCalc, propellerTaperCalc } from "./shaft-end";
import { shimStackCalc } from "./shims";
import { threadPitchCalc } from "./threads";
import { conductorCheckCalc, wireSizeCalc } from "./wire";
import {
  heeledHeightCalc,
  installationAngleCalc,
  rawWaterFlowCalc,
  speedRunsCalc,
  tachPulsesCalc,
} from "./trial";

export type {
  CalcDefinition,
  CalcInput,
  CalcInputSpec,
  CalcOutcome,
  Calculations,
  UnitSystem,
} from "./define";

/**
 * The calculations a template's calc item can name (docs/calculations.md lists their inputs).
 * Each definition lives beside its calculation; this is only the list.
 */
export const calculations: Record<string, CalcDefinition> = Object.fromEntries(
  [
    shaftRunoutCalc,
    couplingFaceCalc,
    couplingRimCalc,
    mountMovesCalc,
    couplingFitCalc,
    isoFitCalc,
    keyForShaftCalc,
    keyForShaftMmCalc,
    propellerTaperCalc,
    threadPitchCalc,
    shaftDiameterCalc,
    bearingSpacingCalc,
    wireSizeCalc,
    conductorCheckCalc,
    propSlipCalc,
    seaTrialLoadingCalc,
    speedRunsCalc,
    exhaustInjectionCalc,
    exhaustBackPressureCalc,
    rawWaterFlowCalc,
    tachPulsesCalc,
    heeledHeightCalc,
    installationAngleCalc,
    shimStackCalc,
    validateHinCalc,
  ].map((definition) => [definition.name, definition]),
);

/** Runs a calculation by name; bad input comes back as an error naming the input. */
export function runCalc(
  name: string,
  inputs: Record<string, CalcInput | undefined>,
): CalcOutcome | { error: { field: string; message: string } } {
  const definition = Object.hasOwn(calculations, name) ? calculations[name] : undefined;
  if (!definition) return { error: { field: "calc", message: `There is no calculation named "${name}".` } };
  return runDefinition(definition, inputs);
}
