"use client";

import { useState } from "react";
import type { ZoneDefinition } from "@/lib/part-types/schemas";

/**
 * The side panel of the zone drawer: how zones are drawn, the view's zones (each removable), a
 * small form to add one (its own form: Enter adds the zone and never submits the part type), and
 * the place the canvas puts its list of shapes (`listRef`).
 */
export function ZoneDrawerPanel({
  notice,
  zones,
  hasSurface,
  suggesting,
  onSuggestSurface,
  onAdd,
  onRemove,
  listRef,
}: {
  /** The drawer's last message, shown first: beside the photo, so the photo never moves for it. */
  notice: React.ReactNode;
  zones: readonly ZoneDefinition[];
  hasSurface: boolean;
  suggesting: boolean;
  onSuggestSurface(): void;
  /** Adds the zone, or answers why not. */
  onAdd(zone: { id: string; label: string }): string | null;
  onRemove(zone: ZoneDefinition): void;
  listRef(element: HTMLElement | null): void;
}) {
  const [newZone, setNewZone] = useState({ id: "", label: "" });
  const [problem, setProblem] = useState<string | null>(null);
  const add = (event: React.FormEvent) => {
    event.preventDefault();
    // React passes events up its own tree, through the portal: the part type's form must not hear this one.
    event.stopPropagation();
    const refused = onAdd(newZone);
    setProblem(refused);
    if (!refused) setNewZone({ id: "", label: "" });
  };
  return (
    <aside className="min-h-0 space-y-4 overflow-y-auto text-sm" data-testid="zone-drawer-panel">
      {notice}
      <p className="text-gauge-700">
        Each zone is one shape, stored relative to the box around the part&apos;s Surface. Pick a zone in the Zones bar above the photo (or by its number key), draw it with Box or Outline; delete a
        shape to draw it again.
      </p>
      {!hasSurface && (
        <div className="space-y-2 rounded-md border border-signal-300 bg-signal-50 p-2" data-testid="zone-drawer-no-surface">
          <p>This photo has no Surface yet: trace the part with the Surface tool, or let the app suggest one. The stored zones appear once it has one.</p>
          <button type="button" className="btn-secondary py-1 text-xs" onClick={onSuggestSurface} disabled={suggesting}>
            {suggesting ? "Looking for the part…" : "Suggest a Surface"}
          </button>
        </div>
      )}
      <section aria-labelledby="zone-list-title" className="space-y-1">
        <h3 id="zone-list-title" className="font-medium">
          Zones of this view
        </h3>
        {zones.length === 0 && <p className="text-gauge-700">None yet: add one below.</p>}
        <ul className="space-y-1" data-testid="zone-list">
          {zones.map((zone) => (
            <li key={zone.id} className="flex items-center justify-between gap-2">
              <span>
                {zone.label}{" "}
                <span className="text-xs text-gauge-600">
                  ({zone.id}
                  {zone.polygon.length < 3 ? ", not drawn yet" : ""})
                </span>
              </span>
              <button type="button" className="btn-secondary py-0.5 text-xs" onClick={() => onRemove(zone)} aria-label={`Remove zone ${zone.label}`}>
                Remove
              </button>
            </li>
          ))}
        </ul>
      </section>
      <form className="space-y-2" onSubmit={add} aria-labelledby="zone-add-title" noValidate>
        <h3 id="zone-add-title" className="font-medium">
          Add a zone
        </h3>
        <label className="block">
          <span className="field-label">Key</span>
          <input className="field-input py-1" value={newZone.id} onChange={(e) => setNewZone({ ...newZone, id: e.target.value })} placeholder="e.g. lens-window" />
        </label>
        <label className="block">
          <span className="field-label">Label</span>
          <input className="field-input py-1" value={newZone.label} onChange={(e) => setNewZone({ ...newZone, label: e.target.value })} placeholder="e.g. Lens window" />
        </label>
        {problem && (
          <p className="field-error" role="alert" data-testid="zone-add-problem">
            {problem}
          </p>
        )}
        <button type="submit" className="btn-secondary py-1 text-xs">
          Add zone
        </button>
      </form>
      <div ref={listRef} data-testid="zone-drawer-shapes" />
    </aside>
  );
}
