import { CalcError } from "~/lib/calc";

/** The field a calculation names when it refuses its input (undefined when it does not refuse). */
export function fieldOf(run: () => unknown): string | undefined {
  try {
    run();
  } catch (error) {
    if (error instanceof CalcError) return error.field;
    throw error;
  }
  return undefined;
}
