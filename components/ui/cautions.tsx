/** The safety and scope cautions the product shows (see README "Cautions"). */
export function BatteryCaution({ className = "" }: { className?: string }) {
  return (
    <div role="note" className={`rounded-md border border-signal-300 bg-signal-50 p-3 text-sm text-signal-700 ${className}`}>
      <strong className="font-semibold">Lithium battery caution.</strong> Swollen, punctured, leaking or hot cells are a fire risk: isolate them in a fire-safe container, do not charge, press or
      puncture them, and follow local hazardous-waste and transport rules.
    </div>
  );
}

/**
 * A reading below an item's "set aside" level: stronger than an ordinary out-of-limit reading.
 * For lithium cells: below about 2.5 V the protection circuit has opened and the pack may not
 * charge normally (docs/references.md: a, Battery University BU-802c); such a cell is treated as
 * suspect and not charged normally (c, common practice). Local codes and licensed practice decide.
 */
export function SuspectCaution({ battery, findings }: { battery: boolean; findings: readonly string[] }) {
  return (
    <div role="alert" className="rounded-md border-2 border-fault-600 bg-fault-50 p-3 text-sm font-medium text-fault-700" data-testid="suspect-reading">
      <strong className="font-semibold">Set {battery ? "this cell" : "this part"} aside as suspect.</strong> {findings.join("; ")}.{" "}
      {battery
        ? "An over-discharged lithium cell may not charge normally and can fail dangerously if it is: do not charge it normally, do not press or puncture it, isolate it in a fire-safe container, label it and follow local hazardous-waste and transport rules."
        : "Do not use or ship it until it has been checked; follow your company's procedure for suspect parts."}
    </div>
  );
}

export function StaticCaution({ className = "" }: { className?: string }) {
  return (
    <div role="note" className={`rounded-md border border-gauge-200 bg-gauge-50 p-3 text-sm text-gauge-800 ${className}`}>
      <strong className="font-semibold">Static-sensitive parts.</strong> Flex cables and boards can be damaged by electrostatic discharge: handle them at a grounded workstation, by the edges, and
      store them in anti-static packaging.
    </div>
  );
}

export function GradeScopeNote({ className = "" }: { className?: string }) {
  return (
    <p className={`text-xs text-gauge-600 ${className}`}>
      Grades are decision aids: company policy, supplier contracts and local regulations decide. Standards tables are summarised; the licensed standard governs.
    </p>
  );
}
