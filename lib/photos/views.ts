/**
 * Which view each newly chosen file probably shows: views that still lack a photo come first
 * (required before optional, in the part type's order), then the cycle starts again. The
 * inspector can change every choice before uploading. Pure.
 */
export type ViewChoice = { key: string; label: string; required: boolean };

export function suggestViews(views: readonly ViewChoice[], coveredKeys: ReadonlySet<string>, count: number): string[] {
  if (views.length === 0) return [];
  const missing = [...views.filter((v) => v.required && !coveredKeys.has(v.key)), ...views.filter((v) => !v.required && !coveredKeys.has(v.key))];
  const order = [...missing, ...views.filter((v) => !missing.includes(v))];
  return Array.from({ length: count }, (_, i) => order[i % order.length].key);
}

/** Required views with no photo that is ready or on its way. */
export function missingRequiredViews(views: readonly ViewChoice[], coveredKeys: ReadonlySet<string>): ViewChoice[] {
  return views.filter((v) => v.required && !coveredKeys.has(v.key));
}
