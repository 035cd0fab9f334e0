import { expect, test } from "vitest";
import { byWorkOrder, workOrder } from "~/lib/templates";

test("checklists sort in the yard's order of work, shop templates after by title", () => {
  // DESIGN §2 and issue 12: shaft and coupling, alignment, exhaust, cooling, fuel, electrical,
  // ventilation, sea trial.
  const shuffled: { key: string; title: string }[] = [...workOrder]
    .reverse()
    .map((key) => ({ key, title: key }));
  shuffled.push(
    { key: "bilge-pumps", title: "Bilge pumps" },
    { key: "anchor-windlass", title: "Anchor windlass" },
  );
  expect(shuffled.sort(byWorkOrder).map((t) => t.key)).toEqual([
    "propeller-shaft-and-coupling",
    "engine-alignment",
    "exhaust",
    "cooling",
    "fuel-system",
    "instruments-and-electrical",
    "ventilation",
    "sea-trial",
    "anchor-windlass",
    "bilge-pumps",
  ]);
});
