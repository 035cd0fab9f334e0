import { createContext, useContext } from "react";
import type { Calculations } from "~/lib/calc/define";

/**
 * The calculations at hand for the checklist on screen. The checklist screen loads the registry
 * only for a template with calc items (its first load stays small), so the editors take it from
 * here rather than importing it; with none provided, no calculation is at hand.
 */
export const CalculationsContext = createContext<Calculations>({});
export const useCalculations = () => useContext(CalculationsContext);
