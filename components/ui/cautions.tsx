/** The safety and scope cautions the product shows (see README "Cautions"). */
export function BatteryCaution({ className = "" }: { className?: string }) {
  return (
    <div role="note" className={`rounded-md border border-signal-300 bg-signal-50 p-3 text-sm text-signal-700 ${className}`}>
      <strong className="font-semibold">Lithium battery caution.</strong> Swollen, punctured, leaking or hot cells are a fire risk: isolate them in a
      fire-safe container, do not charge, press or puncture them, and follow local hazardous-waste and transport rules.
    </div>
  );
}

export function StaticCaution({ className = "" }: { className?: string }) {
  return (
    <div role="note" className={`rounded-md border border-gauge-200 bg-gauge-50 p-3 text-sm text-gauge-800 ${className}`}>
      <strong className="font-semibold">Static-sensitive parts.</strong> Flex cables and boards can be damaged by electrostatic discharge: handle them
      at a grounded workstation, by the edges, and store them in anti-static packaging.
    </div>
  );
}

export function GradeScopeNote({ className = "" }: { className?: string }) {
  return (
    <p className={`text-xs text-gauge-600 ${className}`}>
      Grades are decision aids: company policy, supplier contracts and local regulations decide. Standards tables are summarised; the licensed standard
      governs.
    </p>
  );
}
