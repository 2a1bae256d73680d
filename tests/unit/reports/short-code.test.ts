/**
 * Certificate short codes: Crockford's base 32 with a mod-37 check symbol (Crockford's
 * "Base 32" page, from memory, b). The error-detection tests below follow from the prime modulus
 * and hold for every code, which is what makes a typed code trustworthy.
 */
import { describe, expect, it } from "vitest";
import { checkValue, newShortCode, parseShortCode } from "@/lib/reports/short-code";

const ALPHABET = "0123456789ABCDEFGHJKMNPQRSTVWXYZ";

/** A deterministic random source (a linear congruential generator) for repeatable codes. */
function seeded(seed: number) {
  let state = seed;
  return (max: number) => {
    state = (state * 1103515245 + 12345) % 2 ** 31;
    return state % max;
  };
}

describe("short codes", () => {
  it("compute the check as the value modulo 37 (checked against BigInt arithmetic)", () => {
    for (const data of ["0000000001", "ZZZZZZZZZZ", "7KQ2M9XD3V", "16J"]) {
      const value = [...data].reduce((n, c) => n * 32n + BigInt(ALPHABET.indexOf(c)), 0n);
      expect(checkValue(data)).toBe(Number(value % 37n));
    }
  });

  it("look like XXXX-XXXX-XXX, letters and digits only, and read back as themselves", () => {
    const random = seeded(42);
    for (let i = 0; i < 200; i++) {
      const code = newShortCode(random);
      expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{3}$/);
      expect(parseShortCode(code)).toBe(code);
    }
  });

  it("forgive case, spaces, missing hyphens and the look-alikes O, I, L", () => {
    const code = newShortCode(seeded(7));
    const typed = code.toLowerCase().replace(/-/g, " ").replace(/0/g, "o").replace(/1/g, "l");
    expect(parseShortCode(typed)).toBe(code);
  });

  it("catch every single wrong symbol and every swap of two neighbouring data symbols", () => {
    const code = newShortCode(seeded(3)).replace(/-/g, "");
    for (let i = 0; i < code.length; i++) {
      for (const symbol of ALPHABET) {
        if (symbol === code[i]) continue;
        expect(parseShortCode(code.slice(0, i) + symbol + code.slice(i + 1))).toBeNull();
      }
    }
    // Data symbols are the first ten; the check symbol is the eleventh.
    for (let i = 0; i < code.length - 2; i++) {
      if (code[i] === code[i + 1]) continue;
      const swapped = code.slice(0, i) + code[i + 1] + code[i] + code.slice(i + 2);
      expect(parseShortCode(swapped)).toBeNull();
    }
  });

  it("refuse wrong lengths and symbols outside the alphabet", () => {
    expect(parseShortCode("")).toBeNull();
    expect(parseShortCode("ABCD-EFGH-JK")).toBeNull();
    expect(parseShortCode("ABCD-EFGH-JKMN")).toBeNull();
    expect(parseShortCode("ABCD-EFGH-J#K")).toBeNull();
    expect(parseShortCode("UUUU-UUUU-UUU")).toBeNull();
  });
});
