import type { Template } from "~/lib/templates";
import { ItemNotes } from "./item-notes.tsx";
import { ItemShape } from "./item-shape.tsx";

/** A template read section by section, with everything a technician is told at each item. */
export function ChecklistOutline({ template }: { template: Template }) {
  return (
    <div className="flex flex-col gap-8">
      <p className="text-lg">{template.purpose}</p>
      <nav aria-label="Sections" className="flex flex-wrap gap-2">
        {template.sections.map((s, i) => (
          <a key={s.key} href={`#section-${s.key}`} className="btn">
            {i + 1}. {s.title}
          </a>
        ))}
      </nav>
      {template.sections.map((section, i) => (
        <section key={section.key} id={`section-${section.key}`} aria-labelledby={`title-${section.key}`}>
          <h2 id={`title-${section.key}`} className="mb-3 border-b-2 border-ink pb-1 text-2xl font-bold">
            {i + 1}. {section.title}
          </h2>
          <ol className="flex flex-col gap-4">
            {section.items.map((item) => (
              <li key={item.key} className="card flex flex-col gap-2" data-item={item.key}>
                <h3 className="text-lg font-bold">{item.label}</h3>
                <ItemShape item={item} />
                <ItemNotes item={item} />
              </li>
            ))}
          </ol>
        </section>
      ))}
    </div>
  );
}
