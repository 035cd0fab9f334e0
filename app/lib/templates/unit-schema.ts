import * as z from "zod/mini";
import { isUnit, type Unit } from "~/lib/calc/units";

/** A unit Sternpost knows; zod/mini, so entries can be checked on the tablet without full zod. */
export const unitSchema = z.custom<Unit>((value) => isUnit(value), {
  error: "expected a unit Sternpost knows (in, thou, mm, psi, kPa, inHg, inH2O, degF, degC, rpm, V, A…)",
});
