import type { CalcDefinition, CalcOutcome, Inputs } from "./define";
import { isCalcError } from "./errors";

/**
 * Runs a calculation; bad input comes back as an error naming the input. Apart from define.ts so
 * the checklist screen's evaluator carries no definition helpers (see calculations-for.ts).
 */
export function runDefinition(
  definition: CalcDefinition,
  inputs: Inputs,
): CalcOutcome | { error: { field: string; message: string } } {
  try {
    return definition.run(inputs);
  } catch (error) {
    if (isCalcError(error)) return { error: { field: error.field, message: error.message } };
    throw error;
  }
}
