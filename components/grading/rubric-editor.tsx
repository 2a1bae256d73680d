"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import { useFieldArray, useForm, useWatch, type FieldErrors, type Resolver } from "react-hook-form";
import { FormMessage } from "@/components/ui/form-field";
import { useDateTime } from "@/components/ui/time-zone";
import { fromRubric, newRule, rubricFormErrors, toRubric, type RubricFormValues } from "@/lib/grading/rule-form";
import type { Rubric } from "@/lib/grading/rubric-schema";
import { ApiError, apiFetch } from "@/lib/http/client";
import { PublishDraft } from "./publish-draft";
import { RuleRow } from "./rule-row";
import { type PartTypeSummary, type RubricVersionView } from "./types";
import { rubricKeys } from "@/lib/query-keys/rubrics";

/** react-hook-form resolver: the rubric schema (with the part type's lists) decides what is valid. */
function rubricResolver(lists: PartTypeSummary["lists"]): Resolver<RubricFormValues> {
  return async (values) => {
    const result = rubricFormErrors(values, lists);
    return result.ok ? { values, errors: {} } : { values: {}, errors: result.errors as FieldErrors<RubricFormValues> };
  };
}

/**
 * The draft's rules as an editable list. Every change is validated by lib/grading and, when
 * valid, handed to `onRubricChange` so the live preview grades the sample with it at once.
 */
export function RubricEditor({
  partType,
  draft,
  canPublish,
  onRubricChange,
}: {
  partType: PartTypeSummary;
  draft: RubricVersionView;
  canPublish: boolean;
  onRubricChange: (rubric: Rubric | null) => void;
}) {
  const dateTime = useDateTime();
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const resolver = useMemo(() => rubricResolver(partType.lists), [partType.lists]);
  const form = useForm<RubricFormValues>({ defaultValues: fromRubric(draft.rubric), resolver, mode: "all" });
  const { control, register, handleSubmit, formState, reset, setError, trigger, getValues, setValue } = form;
  const rules = useFieldArray({ control, name: "rules" });
  const notes = useFieldArray({ control, name: "notes" });
  const watched = useWatch({ control }) as RubricFormValues;
  // Rows present when the form was loaded show as sentences; rows added since open for editing.
  const [baseline, setBaseline] = useState(() => draft.rubric.rules.length);
  // The edit this form is based on: a save or publish over someone else's newer edit is refused.
  const [revision, setRevision] = useState(draft.revision);

  // A resolver error is only shown for the field that changed; validate the whole rubric on load
  // and on every change, so a message caused elsewhere (a duplicate id, a metric change, a part
  // type that changed since the draft was saved) appears at once.
  useEffect(() => {
    void trigger();
  }, [watched, trigger]);

  const live = useMemo(() => rubricFormErrors({ rules: watched.rules ?? [], notes: watched.notes ?? [] }, partType.lists), [watched, partType.lists]);
  useEffect(() => onRubricChange(live.ok ? live.rubric : null), [live, onRubricChange]);

  const save = useMutation({
    mutationFn: (values: RubricFormValues) =>
      apiFetch<{ version: number; revision: number; rubric: Rubric }>(`/api/part-types/${partType.id}/rubrics/draft`, {
        method: "PATCH",
        body: { rubric: toRubric(values), version: draft.version, revision },
      }),
    onSuccess: (saved) => {
      setRevision(saved.revision);
      reset(fromRubric(saved.rubric));
      setBaseline(saved.rubric.rules.length);
      setMessage({ kind: "success", text: `Draft version ${saved.version} saved.` });
      void queryClient.invalidateQueries({ queryKey: rubricKeys.versions(partType.id) });
    },
    onError: (err) => {
      if (err instanceof ApiError) {
        for (const [key, text] of Object.entries(err.fieldErrors)) {
          const field = key.replace(/^rubric\.?/, "");
          if (/^rules\.\d+\.\w+$/.test(field)) setError(field as `rules.${number}.id`, { message: text });
        }
      }
      setMessage({ kind: "error", text: err.message });
    },
  });

  const rootError = (formState.errors as { root?: { message?: string } }).root?.message;
  const invalidCount = live.ok ? 0 : live.messages.length;

  return (
    <form onSubmit={handleSubmit((values) => save.mutate(values))} noValidate className="space-y-4" aria-labelledby="draft-title" data-testid="rubric-editor">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 id="draft-title" className="text-lg font-semibold">
            Draft version {draft.version}
          </h2>
          <p className="text-sm text-gauge-700">
            {draft.basedOnVersion ? `Copied from version ${draft.basedOnVersion}. ` : ""}Last saved {dateTime(draft.updatedAt)}
            {draft.updatedByName ? ` by ${draft.updatedByName}` : ""}.
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          <button type="submit" className="btn-primary" disabled={save.isPending || !formState.isDirty}>
            {save.isPending ? "Saving…" : formState.isDirty ? "Save draft" : "Saved"}
          </button>
          {canPublish && (
            <PublishDraft
              partTypeId={partType.id}
              version={draft.version}
              revision={revision}
              blockedReason={formState.isDirty ? "Save the draft before publishing it." : invalidCount > 0 ? "Fix the rules marked in red first." : null}
            />
          )}
        </div>
      </div>
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      {!live.ok && (
        <div role="alert" className="rounded-md border border-fault-600 bg-fault-50 px-3 py-2 text-sm text-fault-700" data-testid="rubric-errors">
          <p className="font-medium">
            {invalidCount} problem{invalidCount === 1 ? "" : "s"} to fix before this draft can be saved:
          </p>
          <ul className="mt-1 list-disc pl-5">
            {live.messages.slice(0, 8).map((text) => (
              <li key={text}>{text}</li>
            ))}
          </ul>
        </div>
      )}
      {rootError && live.ok && <FormMessage kind="error">{rootError}</FormMessage>}

      <ol className="space-y-3" aria-label="Rules">
        {rules.fields.map((field, index) => (
          <RuleRow
            key={field.id}
            index={index}
            control={control}
            register={register}
            errors={formState.errors}
            partType={partType}
            onRemove={() => rules.remove(index)}
            onMove={(delta) => rules.move(index, index + delta)}
            isFirst={index === 0}
            isLast={index === rules.fields.length - 1}
            startOpen={index >= baseline}
            onMetricChange={(metric) => {
              const threshold = getValues(`rules.${index}.threshold`);
              const isClass = ["I", "II", "III", "IV"].includes(threshold);
              if (metric === "pixelFaultClass" && !isClass) setValue(`rules.${index}.threshold`, "I");
              if (metric !== "pixelFaultClass" && isClass) setValue(`rules.${index}.threshold`, "0");
            }}
          />
        ))}
      </ol>
      {rules.fields.length === 0 && <p className="text-sm text-gauge-700">No rules yet: every unit would be graded A unless a critical defect class is found.</p>}
      <button type="button" className="btn-secondary" onClick={() => rules.append(newRule(watched.rules ?? [], partType.lists))}>
        Add rule
      </button>

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Notes shown with the rubric</legend>
        {notes.fields.map((field, index) => (
          <div key={field.id} className="flex items-start gap-2">
            <textarea aria-label={`Note ${index + 1}`} rows={2} className="field-input" aria-invalid={formState.errors.notes?.[index]?.text ? true : undefined} {...register(`notes.${index}.text`)} />
            <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={() => notes.remove(index)}>
              Remove
            </button>
          </div>
        ))}
        <button type="button" className="btn-secondary text-xs" onClick={() => notes.append({ text: "" })}>
          Add note
        </button>
      </fieldset>
    </form>
  );
}
