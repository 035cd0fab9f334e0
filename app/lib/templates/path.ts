/** A field's place in a template or an entry, written as in the file: sections[2].items[0].rule.min. */
export function formatPath(path: readonly PropertyKey[]): string {
  return path
    .map((part, i) => {
      if (typeof part === "number") return `[${part}]`;
      const name = String(part);
      return /^[A-Za-z_][\w-]*$/.test(name) ? (i === 0 ? name : `.${name}`) : `[${JSON.stringify(name)}]`;
    })
    .join("");
}
