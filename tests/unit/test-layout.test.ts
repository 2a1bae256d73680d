/**
 * Unit tests mirror the code (DEVELOPERS.md, "Tests"): a test of lib/<path>/x.ts lives in
 * tests/unit/<path>/, of components/<path>/x.tsx in tests/unit/components/<path>/, of
 * db/<path>/x.ts in tests/unit/db/<path>/. This checks folders, not file names (a test may cover
 * two modules of one folder): every folder under tests/unit must name a folder of the code.
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

/** The folder of the code that tests/unit/<testFolder> mirrors ("" is tests/unit itself → lib/). */
function mirroredFolder(testFolder: string): string {
  const parts = testFolder.split("/").filter(Boolean);
  if (parts[0] === "components" || parts[0] === "db") return parts.join("/");
  return ["lib", ...parts].join("/");
}

/** The test folders (relative to tests/unit) whose mirrored folder does not exist. */
function foldersWithoutCode(testFolders: string[], isFolder: (p: string) => boolean): string[] {
  return testFolders.filter((folder) => !isFolder(mirroredFolder(folder)));
}

function testFolders(root: string): string[] {
  const found: string[] = [];
  const walk = (rel: string) => {
    for (const entry of fs.readdirSync(path.join(root, rel), { withFileTypes: true })) {
      if (!entry.isDirectory()) continue;
      const child = rel ? `${rel}/${entry.name}` : entry.name;
      found.push(child);
      walk(child);
    }
  };
  walk("");
  return found;
}

const isFolder = (p: string) => fs.statSync(path.resolve(p), { throwIfNoEntry: false })?.isDirectory() ?? false;

describe("tests/unit mirrors lib/, components/ and db/", () => {
  it("maps each test folder to the code folder it mirrors", () => {
    expect(mirroredFolder("imaging/raster")).toBe("lib/imaging/raster");
    expect(mirroredFolder("components/annotate")).toBe("components/annotate");
    expect(mirroredFolder("db/seed")).toBe("db/seed");
  });

  it("reports a folder with no code behind it (the old tests/unit/annotate-ui)", () => {
    expect(foldersWithoutCode(["annotate", "annotate-ui", "components/bench"], isFolder)).toEqual(["annotate-ui"]);
  });

  it("every folder under tests/unit has a matching folder in lib/, components/ or db/", () => {
    const misplaced = foldersWithoutCode(testFolders(path.resolve("tests/unit")), isFolder);
    expect(misplaced, `move these tests next to the mirror of the module they test: ${misplaced.join(", ")}`).toEqual([]);
  });
});
