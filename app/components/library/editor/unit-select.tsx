import { dimensionOf, units, type Dimension, type Unit } from "~/lib/calc/units";
import { unitSymbol } from "~/lib/templates";
import type { ControlProps } from "./editor-context.tsx";

const byDimension = units.reduce((groups, unit) => {
  const dimension = dimensionOf(unit);
  groups.set(dimension, [...(groups.get(dimension) ?? []), unit]);
  return groups;
}, new Map<Dimension, Unit[]>());

function optionText(unit: Unit) {
  const symbol = unitSymbol(unit);
  return symbol && symbol !== unit ? `${symbol} (${unit})` : symbol || "plain number (1)";
}

/** Every unit Sternpost knows, grouped by what it measures; or only `among` when given. */
export function UnitSelect({
  value,
  onChange,
  among,
  control,
}: {
  value: string;
  onChange: (unit: string) => void;
  among?: readonly Unit[];
  control: ControlProps;
}) {
  return (
    <select
      {...control}
      value={value}
      onChange={(e) => onChange(e.currentTarget.value)}
      className="field-input"
    >
      {among
        ? among.map((u) => (
            <option key={u} value={u}>
              {optionText(u)}
            </option>
          ))
        : [...byDimension].map(([dimension, list]) => (
            <optgroup key={dimension} label={dimension}>
              {list.map((u) => (
                <option key={u} value={u}>
                  {optionText(u)}
                </option>
              ))}
            </optgroup>
          ))}
    </select>
  );
}
