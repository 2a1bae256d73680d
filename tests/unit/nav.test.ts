import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { OUTBOX_SCREEN, SCREENS, screensFor } from "@/lib/nav";

describe("screensFor", () => {
  const labels = (roles: Parameters<typeof screensFor>[0], outbox = false) => screensFor(roles, { outbox }).map((s) => s.label);
  it("shows each role only its screens", () => {
    expect(labels(["inspector"])).toEqual(["Queue", "Lots", "Gallery", "Calibration", "Part types"]);
    expect(labels(["trainer"])).toEqual(["Gallery", "Calibration", "Rubrics", "Part types"]);
    expect(labels(["auditor"])).toEqual(["Lots", "Gallery", "Recheck", "Rubrics", "Suppliers", "Part types", "Reports"]);
  });
  it("gives several roles the union, in navigation order", () => {
    expect(labels(["trainer", "auditor"])).toEqual(["Lots", "Gallery", "Calibration", "Recheck", "Rubrics", "Suppliers", "Part types", "Reports"]);
  });
  it("shows the Outbox only to leads and only while the local inbox is in use", () => {
    expect(labels(["lead"], true)).toContain("Outbox");
    expect(labels(["lead"], false)).not.toContain("Outbox");
    expect(labels(["auditor"], true)).not.toContain("Outbox");
    expect(labels(["lead"], true)).toContain("People");
  });
});

describe("the navigation decides no API access", () => {
  it("no route handler reads lib/nav.ts (each names its own permission)", () => {
    const readers: string[] = [];
    const walk = (dir: string) => {
      for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
        const full = path.join(dir, entry.name);
        if (entry.isDirectory()) walk(full);
        else if (/from "@\/lib\/nav"/.test(fs.readFileSync(full, "utf8"))) readers.push(full);
      }
    };
    walk(path.resolve("app/api"));
    expect(readers).toEqual([]);
  });
  it("every screen has its page", () => {
    for (const s of [...SCREENS, OUTBOX_SCREEN]) expect(fs.existsSync(path.resolve(`app/(app)${s.href}/page.tsx`)), s.href).toBe(true);
  });
});
