"use client";

import { memo } from "react";
import { DEFECT_SEVERITIES_MILDEST_FIRST, type DefectSeverity } from "@/lib/part-types/severity";
import { ClassSwatch } from "./class-swatch";
import type { ClassEntry } from "./types";

const GROUP: Record<DefectSeverity, { label: string; tone: string; pressed: string }> = {
  minor: { label: "Minor", tone: "text-gauge-600", pressed: "aria-pressed:border-gauge-800 aria-pressed:bg-gauge-800 aria-pressed:text-white" },
  major: { label: "Major", tone: "text-signal-700", pressed: "aria-pressed:border-signal-700 aria-pressed:bg-signal-700 aria-pressed:text-white" },
  critical: { label: "Critical", tone: "text-fault-700", pressed: "aria-pressed:border-fault-700 aria-pressed:bg-fault-700 aria-pressed:text-white" },
};

type Group = { key: string; label: string; tone: string; pressed: string; members: readonly ClassEntry[] };

/**
 * The part type's defect classes, grouped by severity (least severe first, as the number keys
 * run): the class for new regions. A click does what its number key does — it also gives the
 * selected region that class. Critical classes sit last and wear a red edge: a deliberate choice.
 * With `kind` (classes that are not defects: the part type editor's zones) they form one group
 * of that name, with no severity.
 */
export const DefectClassPicker = memo(function DefectClassPicker({
  classes,
  activeDefect,
  onPick,
  kind,
}: {
  classes: readonly ClassEntry[];
  activeDefect: string | null;
  onPick(key: string): void;
  kind?: string;
}) {
  const groups: Group[] = kind
    ? [{ key: "all", label: kind, tone: GROUP.minor.tone, pressed: GROUP.minor.pressed, members: classes }]
    : DEFECT_SEVERITIES_MILDEST_FIRST.filter((severity) => classes.some((c) => c.severity === severity)).map((severity) => ({
        key: severity,
        ...GROUP[severity],
        members: classes.filter((c) => c.severity === severity),
      }));
  return (
    <div role="group" aria-label={kind ?? "Defect class"} className="flex min-w-0 flex-wrap items-center gap-1" data-testid="class-bar">
      {groups.map(({ key: severity, members, ...group }, i) => {
        return (
          // `contents`: the chips of every group flow on the same lines, so the bar wraps as little as it can.
          <div key={severity} role="group" aria-label={kind ?? `${group.label} classes`} className="contents" data-testid={`class-group-${severity}`}>
            <span className={`text-[10px] font-semibold tracking-wide uppercase ${i > 0 ? "ml-2" : ""} ${group.tone}`} aria-hidden="true">
              {group.label}
            </span>
            {members.map((c) => {
              const number = c.index < 9 ? String(c.index + 1) : null;
              return (
                <button
                  key={c.key}
                  type="button"
                  className={`flex h-7 items-center gap-1 rounded-md border bg-white px-1.5 text-xs text-gauge-900 hover:bg-gauge-50 ${severity === "critical" ? "border-fault-600 border-l-4" : "border-gauge-300"} ${group.pressed}`}
                  aria-pressed={activeDefect === c.key}
                  aria-keyshortcuts={number ?? undefined}
                  title={`${c.label}${kind ? "" : ` (${c.severity})`}${number ? ` — key ${number}` : ""}`}
                  onClick={() => onPick(c.key)}
                  data-testid={`defect-class-${c.key}`}
                >
                  {number && <kbd className="font-mono text-[11px] opacity-80">{number}</kbd>}
                  <ClassSwatch style={c.style} size="sm" />
                  <span className="whitespace-nowrap">{c.label}</span>
                </button>
              );
            })}
          </div>
        );
      })}
    </div>
  );
});
