/**
 * A list screen's filters, sort and page live in its URL's query string, read with the same zod
 * schema on the server page and in the browser, so a shared link or the back button shows the
 * same view. Decisions:
 * - A value the schema refuses, a repeated key, an unknown key or an id that is not among the
 *   screen's options (another workspace's supplier, a lot closed since the link was copied) is
 *   left out and its key reported in `ignored`: the screen shows its default for it and says so,
 *   never an error page.
 * - When a filter is left out, the page keys go too: a page number or cursor belongs to the
 *   filtered list it was taken from.
 * - The written query string leaves out defaults and empty values, in the schema's key order, so
 *   one view has one URL.
 * Every key of the schema must be optional or have a default (`schema.parse({})` must succeed).
 */
import type { z } from "zod";

export type RawSearchParams = URLSearchParams | Record<string, string | string[] | undefined>;
export type ParamValues = Record<string, unknown>;
/** Per key, the values a link may carry (e.g. the ids of the suppliers offered in the filter). */
export type AllowedValues<T> = { [K in keyof T]?: readonly string[] };

export type ReadParams<T> = { params: T; ignored: string[] };

/** Each key once, with its only value; keys given more than once are returned apart. */
function singleValues(raw: RawSearchParams): { values: Record<string, string>; repeated: string[] } {
  const values: Record<string, string> = {};
  const repeated = new Set<string>();
  const entries: [string, string][] =
    raw instanceof URLSearchParams ? [...raw.entries()] : Object.entries(raw).flatMap(([k, v]) => (v === undefined ? [] : (Array.isArray(v) ? v : [v]).map((one): [string, string] => [k, one])));
  for (const [key, value] of entries) {
    if (key in values || repeated.has(key)) {
      repeated.add(key);
      delete values[key];
    } else values[key] = value;
  }
  return { values, repeated: [...repeated] };
}

/** The schema's value with nothing given: its defaults. Throws for a schema that cannot hold an empty query string. */
export function defaultParams<T extends ParamValues>(schema: z.ZodType<T>): T {
  const parsed = schema.safeParse({});
  if (!parsed.success) throw new Error(`A list's URL schema must accept an empty query string: ${parsed.error.issues.map((i) => i.message).join("; ")}`);
  return parsed.data;
}

/** Reads a list's state from its query string; what cannot be used is left out and named in `ignored`. */
export function readListParams<T extends ParamValues>(schema: z.ZodType<T>, raw: RawSearchParams, options: { allowed?: AllowedValues<T>; pageKeys?: readonly (keyof T)[] } = {}): ReadParams<T> {
  const { values, repeated } = singleValues(raw);
  const ignored = new Set(repeated);
  const input: Record<string, string> = { ...values };
  let params: T | null = null;
  // Each round drops the keys the schema complained about; a schema has few keys, so this ends.
  for (let round = 0; round <= Object.keys(values).length && params === null; round++) {
    const parsed = schema.safeParse(input);
    if (parsed.success) {
      params = parsed.data;
      break;
    }
    const bad = new Set<string>();
    for (const issue of parsed.error.issues) {
      if (issue.code === "unrecognized_keys") issue.keys.forEach((k) => bad.add(k));
      else if (issue.path.length > 0) bad.add(String(issue.path[0]));
    }
    // A rule across keys with no path to blame: none of the link can be trusted.
    if (bad.size === 0) Object.keys(input).forEach((k) => bad.add(k));
    for (const key of bad) {
      delete input[key];
      ignored.add(key);
    }
  }
  const result = { ...(params ?? defaultParams(schema)) } as Record<string, unknown>;
  const defaults = defaultParams(schema) as Record<string, unknown>;
  for (const [key, allowedValues] of Object.entries(options.allowed ?? {}) as [string, readonly string[] | undefined][]) {
    const value = result[key];
    if (allowedValues && value !== undefined && value !== defaults[key] && !allowedValues.includes(String(value))) {
      if (defaults[key] === undefined) delete result[key];
      else result[key] = defaults[key];
      ignored.add(key);
    }
  }
  const pageKeys = (options.pageKeys ?? []) as readonly string[];
  if ([...ignored].some((key) => !pageKeys.includes(key))) {
    for (const key of pageKeys) {
      if (result[key] === undefined || result[key] === defaults[key]) continue;
      if (defaults[key] === undefined) delete result[key];
      else result[key] = defaults[key];
      ignored.add(key);
    }
  }
  return { params: result as T, ignored: [...ignored] };
}

/** The query string for a list state ("?a=1&b=x", or "" for the defaults), defaults and empty values left out. */
export function listParamsSearch<T extends ParamValues>(schema: z.ZodType<T>, params: T): string {
  const defaults = defaultParams(schema) as Record<string, unknown>;
  const out = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === null || value === "" || value === defaults[key]) continue;
    out.set(key, String(value));
  }
  const text = out.toString();
  return text ? `?${text}` : "";
}
