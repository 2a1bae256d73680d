"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { ApiError, apiFetch } from "@/lib/http/client";
import { describeSerialProblems, hasSerialProblems, parseSerialCsv } from "@/lib/units/serial-csv";

/**
 * Creates a lot's sample: paste or upload the supplier's serial list (checked here line by line,
 * and again on the server) and the app draws the sample with a recorded seed — or make numbered
 * placeholders whose serials inspectors scan on the bench.
 */
export function UnitImport({ lotId, sampleSize, quantity }: { lotId: string; sampleSize: number; quantity: number }) {
  const router = useRouter();
  const [csv, setCsv] = useState("");
  const [problems, setProblems] = useState<string[]>([]);
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const parsed = useMemo(() => (csv.trim() ? parseSerialCsv(csv) : null), [csv]);
  const localProblems = parsed && hasSerialProblems(parsed) ? describeSerialProblems(parsed) : [];
  const count = parsed?.serials.length ?? 0;
  const countProblem =
    parsed && !hasSerialProblems(parsed)
      ? count > quantity
        ? `The list has ${count} serials but the lot has ${quantity} units.`
        : count < sampleSize
          ? `The plan needs ${sampleSize} units; the list has ${count}.`
          : null
      : null;

  const create = useMutation({
    mutationFn: (body: { source: "serials"; csv: string } | { source: "placeholders" }) => apiFetch<{ created: number; draw: { seed?: string } }>(`/api/lots/${lotId}/units`, { body }),
    onSuccess: (d) => {
      setMessage({ kind: "success", text: `${d.created} units created${d.draw.seed ? ` (draw seed ${d.draw.seed})` : ""}.` });
      router.refresh();
    },
    onError: (err) => {
      setProblems(
        err instanceof ApiError
          ? Object.entries(err.fieldErrors)
              .filter(([k]) => k.startsWith("csv."))
              .map(([, v]) => v)
          : [],
      );
      setMessage({ kind: "error", text: err.message });
    },
  });

  return (
    <div className="card space-y-4 p-5" data-testid="unit-import">
      <div>
        <h2 className="text-lg font-semibold">Sample units</h2>
        <p className="text-sm text-gauge-700">
          The plan inspects {sampleSize} of {quantity} units. Paste or upload the supplier&apos;s serial list and Partproof draws {sampleSize} at random (the seed is recorded, so the draw can be
          repeated), or make numbered placeholders and scan each serial on the bench.
        </p>
      </div>
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      <div className="space-y-2">
        <label htmlFor="serial-csv" className="field-label">
          Serials (CSV, or one a line; a “serial” header column is found by name)
        </label>
        <textarea id="serial-csv" rows={6} className="field-input font-mono" value={csv} onChange={(e) => setCsv(e.target.value)} placeholder={"serial\nOV-CAM-24-000123\nOV-CAM-24-000124"} />
        <label className="block text-sm">
          <span className="text-gauge-700">…or upload a file: </span>
          <input type="file" accept=".csv,.txt,text/csv,text/plain" aria-label="Upload a serial list" onChange={async (e) => setCsv((await e.target.files?.[0]?.text()) ?? "")} />
        </label>
        {parsed && (
          <p className="text-sm text-gauge-700" data-testid="serial-count">
            {count} serial{count === 1 ? "" : "s"} read{parsed.headerLine ? ` (header on line ${parsed.headerLine})` : ""}.
          </p>
        )}
        {[...localProblems, ...(localProblems.length ? [] : problems)].length > 0 && (
          <ul className="list-disc space-y-0.5 rounded-md bg-fault-50 py-2 pl-8 pr-3 text-sm text-fault-700" role="alert" data-testid="serial-problems">
            {(localProblems.length ? localProblems : problems).map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        )}
        {countProblem && <p className="field-error">{countProblem}</p>}
      </div>
      <div className="flex flex-wrap gap-3">
        <button
          type="button"
          className="btn-primary"
          disabled={!parsed || localProblems.length > 0 || countProblem !== null || create.isPending}
          onClick={() => create.mutate({ source: "serials", csv })}
        >
          Draw {sampleSize} from the list
        </button>
        <button type="button" className="btn-secondary" disabled={create.isPending} onClick={() => create.mutate({ source: "placeholders" })}>
          Make {sampleSize} numbered placeholders
        </button>
      </div>
    </div>
  );
}
