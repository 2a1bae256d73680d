/**
 * The short code printed on a condition certificate, for a buyer who types it instead of scanning
 * the QR code: ten random symbols of Crockford's base 32 and one check symbol, shown as
 * "XXXX-XXXX-XXX".
 *
 * Crockford's base 32 (from memory, b): symbols 0-9 A-Z without I, L, O and U; reading is
 * case-insensitive, O reads as 0, I and L as 1, and hyphens are ignored; the check symbol is the
 * value modulo 37, written with five extra symbols * ~ $ = U for 32–36. A prime modulus larger
 * than the alphabet catches every single wrong symbol and every swap of two neighbouring
 * data symbols.
 * Our choice: a code whose check would be one of the five extra symbols is drawn again, so every
 * code is letters and digits only (this costs 0.2 of its 50 random bits).
 */
import { randomInt } from "node:crypto";

const ALPHABET = "0123456789ABCDEFGHJKMNPQRSTVWXYZ";
const CHECK_EXTRA = "*~$=U";
export const SHORT_CODE_DATA_SYMBOLS = 10;

const valueOf = (symbol: string): number => {
  const normal = symbol === "O" ? "0" : symbol === "I" || symbol === "L" ? "1" : symbol;
  return ALPHABET.indexOf(normal);
};

/** Value of the data symbols modulo 37, computed digit by digit (exact for any length). */
export function checkValue(dataSymbols: string): number {
  let remainder = 0;
  for (const symbol of dataSymbols) {
    const value = valueOf(symbol);
    if (value < 0) throw new RangeError(`"${symbol}" is not a base-32 symbol`);
    remainder = (remainder * 32 + value) % 37;
  }
  return remainder;
}

const checkSymbol = (value: number) => (value < 32 ? ALPHABET[value] : CHECK_EXTRA[value - 32]);
const format = (symbols: string) => `${symbols.slice(0, 4)}-${symbols.slice(4, 8)}-${symbols.slice(8)}`;

/** A new random code, e.g. "7KQ2-M9XD-3VR". `random(n)` is replaceable for tests. */
export function newShortCode(random: (max: number) => number = randomInt): string {
  for (;;) {
    let data = "";
    for (let i = 0; i < SHORT_CODE_DATA_SYMBOLS; i++) data += ALPHABET[random(32)];
    const check = checkValue(data);
    if (check < 32) return format(data + checkSymbol(check));
  }
}

/**
 * Reads a typed code: case, spaces and hyphens do not matter, O/I/L are read as 0/1/1. Returns the
 * canonical form, or null when it is not a code (wrong length, unknown symbol, check fails).
 */
export function parseShortCode(typed: string): string | null {
  const compact = typed.toUpperCase().replace(/[\s-]/g, "");
  if (compact.length !== SHORT_CODE_DATA_SYMBOLS + 1) return null;
  const data = compact.slice(0, SHORT_CODE_DATA_SYMBOLS);
  const check = compact.slice(SHORT_CODE_DATA_SYMBOLS);
  if ([...data].some((symbol) => valueOf(symbol) < 0)) return null;
  const expected = checkValue(data);
  const given = CHECK_EXTRA.includes(check) ? 32 + CHECK_EXTRA.indexOf(check) : valueOf(check);
  if (given !== expected) return null;
  const canonical = [...data].map((symbol) => ALPHABET[valueOf(symbol)]).join("");
  return format(canonical + checkSymbol(expected));
}
