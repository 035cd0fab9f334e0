import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { diffTemplates, inOrder } from "~/lib/templates/diff";
import { edited, small, starter, starterLibrary } from "./fixtures.ts";

const keysOf = (diff: ReturnType<typeof diffTemplates>, status: string) =>
  diff.items.filter((c) => c.status === status).map((c) => c.key);

describe("differences between two versions", () => {
  test("a new version with nothing changed but its number is the same", () => {
    for (const template of starterLibrary()) {
      const next = edited(template, (t) => (t.version = 2));
      const diff = diffTemplates(template, next);
      expect(diff.same).toBe(true);
      expect(diff.items).toEqual([]);
      expect(diff.to.version).toBe(2);
    }
  });

  test("an added measure item with a tolerance is reported where it was added", () => {
    const v1 = starter("engine-alignment");
    const v2 = edited(v1, (t) => {
      t.version = 2;
      const final = t.sections.find((s: any) => s.key === "final-alignment");
      final.items.splice(2, 0, {
        kind: "measure",
        key: "coupling-bolt-torque",
        label: "Coupling bolt torque",
        unit: "lbfFt",
        rule: { nominal: 40, tolerance: 2, unit: "lbfFt" },
      });
    });
    const diff = diffTemplates(v1, v2);
    expect(diff.items).toEqual([
      {
        key: "coupling-bolt-torque",
        label: "Coupling bolt torque",
        kind: "measure",
        status: "added",
        to: { sectionKey: "final-alignment", sectionTitle: "Final alignment afloat", position: 3 },
        moved: false,
        fields: [],
        item: {
          kind: "measure",
          key: "coupling-bolt-torque",
          label: "Coupling bolt torque",
          required: true,
          unit: "lbfFt",
          rule: { nominal: 40, tolerance: 2, unit: "lbfFt" },
        },
      },
    ]);
    expect(diff.counts).toEqual({ added: 1, removed: 0, moved: 0, changed: 0 });
    // Items after the insertion shift down a place but did not move relative to each other.
    expect(diff.items.some((c) => c.moved)).toBe(false);
  });

  test("a removed item is listed after the item it followed, with where it was", () => {
    const v1 = small();
    const v2 = edited(v1, (t) => t.sections[0].items.splice(1, 1));
    const diff = diffTemplates(v1, v2);
    expect(diff.items).toEqual([
      {
        key: "b",
        label: "Check b",
        kind: "check",
        status: "removed",
        from: { sectionKey: "one", sectionTitle: "One", position: 2 },
        moved: false,
        fields: [],
        item: v1.sections[0].items[1],
      },
    ]);
  });

  test("changed fields name the field, one level down, with before and after", () => {
    const v1 = starter("engine-alignment");
    const v2 = edited(v1, (t) => {
      const gaps = t.sections.flatMap((s: any) => s.items).find((i: any) => i.key === "face-gaps");
      gaps.label = "Face gaps at 12, 3, 6 and 9 o'clock";
      gaps.rule = { min: 0, max: 0.02, unit: "in" };
      delete gaps.caution;
      const angularity = t.sections
        .flatMap((s: any) => s.items)
        .find((i: any) => i.key === "face-angularity");
      angularity.inputs.maxInPerInDiameter = { value: 0.0005 };
    });
    const diff = diffTemplates(v1, v2);
    const gaps = diff.items.find((c) => c.key === "face-gaps")!;
    expect(gaps.status).toBe("kept");
    expect(gaps.moved).toBe(false);
    expect(gaps.fields).toEqual([
      {
        field: "label",
        before: "Face gaps at four clock positions",
        after: "Face gaps at 12, 3, 6 and 9 o'clock",
      },
      { field: "rule.max", before: undefined, after: 0.02 },
      { field: "caution", before: v1.sections[2].items[3].caution, after: undefined },
    ]);
    expect(diff.items.find((c) => c.key === "face-angularity")!.fields).toEqual([
      { field: "inputs.maxInPerInDiameter", before: { value: 0.001 }, after: { value: 0.0005 } },
    ]);
    expect(diff.counts.changed).toBe(2);
  });

  test("swapping two neighbours is one move, not two", () => {
    const v1 = small();
    const v2 = edited(v1, (t) => {
      const [a, b] = t.sections[0].items;
      t.sections[0].items.splice(0, 2, b, a);
    });
    const diff = diffTemplates(v1, v2);
    expect(diff.counts.moved).toBe(1);
    expect(diff.items).toHaveLength(1);
    expect(["a", "b"]).toContain(diff.items[0].key);
  });

  test("an item taken to another section is moved, from one place to the other", () => {
    const v1 = small();
    const v2 = edited(v1, (t) => {
      const [c] = t.sections[0].items.splice(2, 1);
      t.sections[1].items.unshift(c);
    });
    const diff = diffTemplates(v1, v2);
    expect(diff.items).toEqual([
      {
        key: "c",
        label: "Check c",
        kind: "check",
        status: "kept",
        from: { sectionKey: "one", sectionTitle: "One", position: 3 },
        to: { sectionKey: "two", sectionTitle: "Two", position: 1 },
        moved: true,
        fields: [],
        item: v1.sections[0].items[2],
      },
    ]);
  });

  test("a section moved or renamed is said once, at the section", () => {
    const v1 = small();
    const v2 = edited(v1, (t) => {
      t.sections.reverse();
      t.sections[0].title = "Second, now first";
    });
    const diff = diffTemplates(v1, v2);
    expect(diff.items).toEqual([]);
    expect(diff.sections.filter((s) => s.moved)).toHaveLength(1);
    expect(diff.sections.find((s) => s.key === "two")!.fields).toEqual([
      { field: "title", before: "Two", after: "Second, now first" },
    ]);
    expect(diff.same).toBe(false);
  });

  test("title and purpose changes are listed; added and removed sections are marked", () => {
    const v1 = small();
    const v2 = edited(v1, (t) => {
      t.title = "Smaller";
      t.sections.splice(1, 1, {
        key: "three",
        title: "Three",
        items: [{ kind: "text", key: "f", label: "Notes" }],
      });
    });
    const diff = diffTemplates(v1, v2);
    expect(diff.fields).toEqual([{ field: "title", before: "Small", after: "Smaller" }]);
    // A removed section is listed right after the one it followed.
    expect(diff.sections.map((s) => [s.key, s.status])).toEqual([
      ["one", "kept"],
      ["two", "removed"],
      ["three", "added"],
    ]);
    expect(keysOf(diff, "added")).toEqual(["f"]);
    expect(keysOf(diff, "removed")).toEqual(["d", "e"]);
  });

  test("added and removed are exactly the keys one version has and the other lacks", () => {
    const base = starter("propeller-shaft-and-coupling");
    const allKeys = base.sections.flatMap((s) => s.items.map((i) => i.key));
    fc.assert(
      fc.property(fc.subarray(allKeys), fc.integer({ min: 0, max: 3 }), (dropped, extra) => {
        // The structure only: a calc left without its input is still a template to compare.
        const next = structuredClone(base);
        next.sections.forEach((s) => (s.items = s.items.filter((i) => !dropped.includes(i.key))));
        for (let n = 0; n < extra; n++)
          next.sections[0].items.push({
            kind: "text",
            key: `extra-${n}`,
            label: `Extra ${n}`,
            required: true,
          });
        const diff = diffTemplates(base, next);
        expect(new Set(keysOf(diff, "removed"))).toEqual(new Set(dropped));
        expect(keysOf(diff, "added")).toEqual(Array.from({ length: extra }, (_, n) => `extra-${n}`));
        expect(diff.counts.moved).toBe(0);
      }),
      { numRuns: 60 },
    );
  });
});

describe("the order two lists keep", () => {
  test("is a longest common subsequence", () => {
    // Worked by hand: ABCBDAB against BDCABA keeps four (e.g. BCBA), the classic textbook pair
    // (Cormen et al., Introduction to Algorithms, §15.4).
    expect(inOrder([..."ABCBDAB"], [..."BDCABA"])).toHaveLength(4);
    expect(inOrder(["a", "b", "c"], ["c", "a", "b"])).toEqual(["a", "b"]);
    expect(inOrder([], ["a"])).toEqual([]);
  });
});
