import { calculations } from "../calc/registry.ts";

/** Every calculator page, kept for offline use with the jobs. */
export const calculatorPages = () => Object.keys(calculations).map((name) => `/calculators/${name}`);
