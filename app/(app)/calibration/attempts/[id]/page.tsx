import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { AttemptResult, type KeyedItem } from "@/components/calibration/attempt-result";
import { AttemptTaker, type BlindItem } from "@/components/calibration/attempt-taker";
import { measurementLabels } from "@/components/grading/measurement-labels";
import { listPartTypes } from "@/db/queries/part-types";
import { requirePageUser } from "@/lib/auth/require-user";
import { readAttempt } from "@/lib/calibration/attempts";
import { AppError } from "@/lib/errors";
import { pageIdOrNotFound } from "@/lib/http/page-params";
import { isBatteryPart, STATIC_SENSITIVE, type PartCategory } from "@/lib/part-types/schemas";

export const metadata: Metadata = { title: "Calibration attempt" };

/**
 * One's own calibration attempt: taken blind while in progress (the page gets only what
 * readAttempt gives a taker before submission: places, part types and views, photo sizes), the
 * result with the key once submitted. Anyone else's attempt is not found.
 */
export default async function CalibrationAttemptPage(props: PageProps<"/calibration/attempts/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "calibration.take", from: `/calibration/attempts/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const attempt = await readAttempt(user, id).catch((err: unknown) => {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  });
  const partTypes = new Map((await listPartTypes({ workspaceId: user.workspaceId })).map((p) => [p.id, p]));
  const viewOf = (partTypeId: string, viewKey: string) => partTypes.get(partTypeId)?.views.find((v) => v.key === viewKey);

  if (attempt.result === null) {
    const items: BlindItem[] = attempt.items.map((item) => {
      const partType = partTypes.get(item.partTypeId);
      const view = viewOf(item.partTypeId, item.viewKey);
      return {
        position: item.position,
        partTypeName: item.partTypeName,
        cautions: { battery: partType ? isBatteryPart(partType) : false, staticSensitive: partType ? STATIC_SENSITIVE.includes(partType.category as PartCategory) : false },
        viewLabel: view?.label ?? item.viewKey,
        width: item.width,
        height: item.height,
        previewWidth: "previewWidth" in item ? item.previewWidth : null,
        previewHeight: "previewHeight" in item ? item.previewHeight : null,
        allowedDefects: partType?.defectClasses.map((d) => ({ key: d.key, label: d.label, severity: d.severity })) ?? [],
        zones: view?.zones ?? [],
        labels: partType ? measurementLabels(partType) : { defects: {}, zones: {}, views: {} },
      };
    });
    return <AttemptTaker attemptId={attempt.id} setName={attempt.setName} items={items} initialAnswers={attempt.answers} />;
  }

  const items: KeyedItem[] = attempt.items.map((item) => ({
    position: item.position,
    partTypeName: item.partTypeName,
    viewLabel: viewOf(item.partTypeId, item.viewKey)?.label ?? item.viewKey,
    keyRegions: "keyRegions" in item ? item.keyRegions : { regions: [], surfaces: [], ruler: null },
    keyGrade: "keyGrade" in item ? item.keyGrade : "A",
    keyCaption: "keyCaption" in item ? item.keyCaption : "",
    width: item.width,
    height: item.height,
    classLabels: Object.fromEntries(partTypes.get(item.partTypeId)?.defectClasses.map((d) => [d.key, d.label]) ?? []),
  }));
  return (
    <AttemptResult
      attemptId={attempt.id}
      setName={attempt.setName}
      items={items}
      answers={attempt.answers}
      result={{ passed: attempt.result.passed, summary: attempt.result.summary, items: attempt.result.items }}
    />
  );
}
