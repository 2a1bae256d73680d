import { describe, expect, it } from "vitest";
import { slugify } from "@/lib/accounts/slugify";

describe("slugify", () => {
  it("keeps ASCII letters and digits", () => {
    expect(slugify("Vellmoor Spares & Co.")).toBe("vellmoor-spares-co");
    expect(slugify("Ølstrøm Ærø")).toBe("lstr-m-r");
    expect(slugify("!!!")).toBe("workspace");
  });
});
