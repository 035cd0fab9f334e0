import { useState } from "react";
import { CalcDiagram } from "~/components/checklist/calc-diagram";
import { CalculationsContext } from "~/components/checklist/calculations-context";
import { FillItem } from "~/components/checklist/fill-item";
import { calculations } from "~/lib/calc/registry";
import { progress, type Template } from "~/lib/templates";

/**
 * A template as the technician will fill it: the fill screen's own items, live, so whoever writes
 * the template can try entries and see the verdicts and calculations its rules give. Nothing typed
 * here is kept (no checklist exists); photo items show what they ask for, without the camera.
 */
export function ChecklistPreview({ template }: { template: Template }) {
  const [values, setValues] = useState<Record<string, unknown>>({});
  const state = progress(template, values);
  return (
    <CalculationsContext value={calculations}>
      <div className="flex flex-col gap-8" data-testid="checklist-preview">
        <p className="text-lg">{template.purpose}</p>
        <nav aria-label="Sections" className="flex flex-wrap gap-2">
          {template.sections.map((s, i) => (
            <a key={s.key} href={`#preview-${s.key}`} className="btn">
              {i + 1}. {s.title}
            </a>
          ))}
        </nav>
        {template.sections.map((section, i) => (
          <section
            key={section.key}
            id={`preview-${section.key}`}
            aria-labelledby={`preview-title-${section.key}`}
          >
            <h2
              id={`preview-title-${section.key}`}
              className="mb-3 border-b-2 border-ink pb-1 text-2xl font-bold"
            >
              {i + 1}. {section.title}
            </h2>
            <ol className="flex flex-col gap-4">
              {section.items.map((item) => (
                <FillItem
                  key={item.key}
                  item={item}
                  template={template}
                  responses={values}
                  value={values[item.key]}
                  verdict={state.verdicts[item.key]!}
                  pending={false}
                  by="Preview"
                  disabled={false}
                  onSave={(value) => setValues((v) => ({ ...v, [item.key]: value }))}
                  diagram={
                    <CalcDiagram
                      item={item}
                      template={template}
                      responses={values}
                      verdict={state.verdicts[item.key]!}
                    />
                  }
                />
              ))}
            </ol>
          </section>
        ))}
      </div>
    </CalculationsContext>
  );
}
