import { describe, expect, it } from "vitest";
import { canvasHint } from "@/components/annotate/canvas-hint";
import { TOOLS } from "@/lib/annotate/tools";
import { makeState, withTool } from "../../annotate/helpers";

const words = (text: string) =>
  text
    .toLowerCase()
    .split(/[^a-z]+/)
    .filter((w) => w.length >= 6);

/** Longer words of the key reminder that the tool's description has already used. */
function saidTwice(description: string, reminder: string): string[] {
  const said = new Set(words(description));
  return words(reminder).filter((w) => said.has(w));
}

describe("the hint line over the photo", () => {
  it.each(TOOLS.map((t) => [t.id] as const))("for %s says the tool's description and its keys once, without repeating itself", (tool) => {
    // The line is one row over the photo's top edge; at 1024 px it was cut after repeating
    // "drag sets the radius" that the Spot description had just said.
    const state = { ...withTool(makeState(), tool), activeDefect: "scratch" };
    const hint = canvasHint(state, "ready", false);
    const { description } = TOOLS.find((t) => t.id === tool)!;
    expect(hint.startsWith(description)).toBe(true);
    expect(hint).toMatch(/Esc (cancels|clears) · \? all keys$/);
    expect(saidTwice(description, hint.slice(description.length))).toEqual([]);
  });

  it("says what is wrong before anything else: a failed photo, then a class to choose", () => {
    expect(canvasHint(makeState(), "failed", false)).toMatch(/could not be loaded/);
    expect(canvasHint({ ...withTool(makeState(), "box"), activeDefect: null }, "ready", false)).toMatch(/^Choose a defect class/);
    expect(canvasHint(makeState(), "ready", true)).toMatch(/^View only/);
  });
});
