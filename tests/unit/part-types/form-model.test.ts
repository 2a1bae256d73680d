/** The part type editor's text formats round-trip every seeded part type exactly (our format, c). */
import { describe, expect, it } from "vitest";
import { PART_TYPE_CATALOGUE } from "@/lib/part-types/starter-catalogue";
import { formToInput, partTypeToForm, textToOptions, textToZones } from "@/lib/part-types/form-model";
import { partTypeSchema } from "@/lib/part-types/schemas";

describe("part type form model", () => {
  for (const entry of PART_TYPE_CATALOGUE) {
    it(`${entry.slug}: form values → API body gives back the part type`, () => {
      const { slug: _slug, ...input } = { ...entry, active: true };
      const body = partTypeSchema.parse(formToInput(partTypeToForm(input)));
      expect(body).toEqual(partTypeSchema.parse(input));
    });
  }

  it("reads zones and choices line by line, ignoring blank lines and spaces", () => {
    expect(textToZones("lens-window | Lens window | 0.2,0.2 0.8,0.2  0.5,0.9\n\n")).toEqual([
      {
        id: "lens-window",
        label: "Lens window",
        polygon: [
          [0.2, 0.2],
          [0.8, 0.2],
          [0.5, 0.9],
        ],
      },
    ]);
    expect(textToOptions("none | None | pass\nloud | Loud | fail")).toEqual([
      { value: "none", label: "None", passes: true },
      { value: "loud", label: "Loud", passes: false },
    ]);
  });

  it("keeps what cannot be read as typed, so the schema names the problem", () => {
    const values = partTypeToForm({ ...PART_TYPE_CATALOGUE[2], active: true });
    values.checklist[3].min = "three";
    const result = partTypeSchema.safeParse(formToInput(values));
    expect(result.success).toBe(false);
    expect(result.error!.issues[0].path).toEqual(["checklist", 3, "min"]);
  });
});
