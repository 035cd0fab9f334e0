import type { ItemKind } from "~/lib/templates";

/** What each kind of item is called on the library's screens. */
export const kindNames: Record<ItemKind, string> = {
  check: "Check",
  measure: "Measurement",
  readings: "Readings grid",
  calc: "Calculation",
  choice: "Choice",
  text: "Note",
  photo: "Photos",
  initials: "Initials",
};
