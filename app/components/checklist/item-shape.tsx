import { unitSymbol, type Item } from "~/lib/templates";

const kindLabels: Record<Item["kind"], string> = {
  check: "Pass / fail / not applicable",
  measure: "Measurement",
  readings: "Readings grid",
  calc: "Calculated",
  choice: "Choose one",
  text: "Note",
  photo: "Photos",
  initials: "Initials",
};

/** What the technician will be asked for, in words (the read-only and preview screens). */
export function ItemShape({ item }: { item: Item }) {
  let detail: React.ReactNode = null;
  switch (item.kind) {
    case "measure":
      detail = `in ${(item.accepts ?? [item.unit]).map(unitSymbol).join(" or ")}`;
      break;
    case "readings":
      detail = (
        <table className="mt-1 border-collapse text-sm">
          <thead>
            <tr>
              <th className="border border-rule p-1"></th>
              {item.columns.map((c) => (
                <th key={c.key} className="border border-rule p-1">
                  {c.label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {item.rows.map((r) => (
              <tr key={r.key}>
                <th className="border border-rule p-1 text-left">{r.label}</th>
                {item.columns.map((c) => (
                  <td key={c.key} className="border border-rule p-1 text-center text-ink-soft">
                    {unitSymbol(item.unit)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      );
      break;
    case "calc":
      detail = `from ${Object.values(item.inputs).filter((b) => "item" in b).length} other entries`;
      break;
    case "choice":
      detail = item.options.map((o) => o.label).join(" · ");
      break;
    case "photo":
      detail = `at least ${item.minPhotos}`;
      break;
  }
  return (
    <div className="text-sm">
      <span className="rounded bg-paper px-2 py-0.5 font-bold">{kindLabels[item.kind]}</span> {detail}
    </div>
  );
}
