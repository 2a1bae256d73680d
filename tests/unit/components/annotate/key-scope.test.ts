import { describe, expect, it } from "vitest";
import { canvasTakesKey, isTypingTarget, keyInputOf, type KeyTarget } from "@/components/annotate/key-scope";

const input = (type?: string): KeyTarget => ({ tagName: "INPUT", type });

describe("keys typed into form fields stay there", () => {
  it.each([
    ["a text input", input("text")],
    ["an input without a type", input()],
    ["a number input (the ruler length)", input("number")],
    ["a search input", input("search")],
    ["an input of a type the browser does not know", input("weird")],
    ["a textarea", { tagName: "TEXTAREA" }],
    ["a select", { tagName: "select" }],
    ["a contenteditable element", { tagName: "DIV", isContentEditable: true }],
    ["a custom textbox", { tagName: "DIV", role: "textbox" }],
    ["a combobox", { tagName: "DIV", role: "combobox" }],
  ])("%s is a typing target", (_name, target) => {
    expect(isTypingTarget(target as KeyTarget)).toBe(true);
    for (const key of ["b", "1", "Delete", "Backspace", "Escape", "z", "?", " ", "ArrowLeft"]) expect(canvasTakesKey(target as KeyTarget, key)).toBe(false);
  });

  it.each([["checkbox"], ["radio"], ["button"], ["range"], ["color"]])("a %s input is not a typing target", (type) => {
    expect(isTypingTarget(input(type))).toBe(false);
  });
});

describe("the canvas takes its keys elsewhere in its own area", () => {
  it("takes every key when nothing is focused or the stage is", () => {
    expect(canvasTakesKey(null, "b")).toBe(true);
    const stage = { tagName: "DIV", role: "application" };
    for (const key of ["b", "1", "Enter", " ", "ArrowUp", "Delete", "?"]) expect(canvasTakesKey(stage, key)).toBe(true);
  });

  it("leaves Enter and Space to buttons, links and checkboxes but takes tool letters there", () => {
    for (const target of [{ tagName: "BUTTON" }, { tagName: "A" }, { tagName: "SUMMARY" }, input("checkbox"), { tagName: "DIV", role: "button" }]) {
      expect(canvasTakesKey(target, "Enter")).toBe(false);
      expect(canvasTakesKey(target, " ")).toBe(false);
      expect(canvasTakesKey(target, "b")).toBe(true);
      expect(canvasTakesKey(target, "3")).toBe(true);
    }
  });

  it("leaves arrow keys to radios and sliders", () => {
    expect(canvasTakesKey(input("radio"), "ArrowDown")).toBe(false);
    expect(canvasTakesKey(input("range"), "ArrowLeft")).toBe(false);
    expect(canvasTakesKey({ tagName: "DIV", role: "slider" }, "ArrowRight")).toBe(false);
    expect(canvasTakesKey({ tagName: "BUTTON" }, "ArrowRight")).toBe(true);
  });
});

describe("keyInputOf", () => {
  it("counts Cmd as Ctrl (macOS)", () => {
    expect(keyInputOf({ key: "z", shiftKey: false, altKey: false, ctrlKey: false, metaKey: true })).toEqual({ key: "z", shift: false, alt: false, mod: true });
    expect(keyInputOf({ key: "Z", shiftKey: true, altKey: false, ctrlKey: true, metaKey: false })).toEqual({ key: "Z", shift: true, alt: false, mod: true });
  });
});
