/**
 * Calibration fixtures: five published gallery items of the fixture part type (ready photos with
 * their preview objects in the store, so the attempt's image route streams real bytes), a set made
 * of them through the API, assigned to a taker. The same PostgreSQL and store the app uses.
 */
import sharp from "sharp";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import { objectStore, putObject } from "@/lib/storage/s3";
import { EMPTY_REGIONS, insertItem, SCRATCHED } from "./gallery";
import { createMeasurableUnit, createPhoto, workspaceIdOf } from "./grading";
import { api, type Session } from "./http";

/** The keys: item 1 scratched (C), 2 normal (A), 3 a dent (B), 4 scratched (C), 5 normal (A). */
export const DENTED: RegionSetPayload = {
  regions: [{ id: "d1", defect: "dent", shape: { kind: "spot", x: 150, y: 100, radius: 8 } }],
  surfaces: SCRATCHED.surfaces,
  ruler: null,
};
export const KEYS: { regions: RegionSetPayload; grade: Grade; caption: string }[] = [
  { regions: SCRATCHED, grade: "C", caption: "KEY-CAPTION-1 scratch across the lens window" },
  { regions: { ...EMPTY_REGIONS, surfaces: SCRATCHED.surfaces }, grade: "A", caption: "KEY-CAPTION-2 clean" },
  { regions: DENTED, grade: "B", caption: "KEY-CAPTION-3 small dent" },
  { regions: SCRATCHED, grade: "C", caption: "KEY-CAPTION-4 scratch again" },
  { regions: { ...EMPTY_REGIONS, surfaces: SCRATCHED.surfaces }, grade: "A", caption: "KEY-CAPTION-5 clean again" },
];

/** Five published items (and one draft) of a fresh part type in the lead's workspace. */
export async function createCalibrationItems(lead: Session) {
  const owner = await workspaceIdOf(lead.email);
  const scene = await createMeasurableUnit(owner);
  const preview = await sharp({ create: { width: 300, height: 200, channels: 3, background: { r: 120, g: 120, b: 130 } } })
    .webp()
    .toBuffer();
  const published = [];
  for (const key of KEYS) {
    const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId: scene.unit.id, uploadedBy: owner.userId });
    await putObject(objectStore(), photo.previewKey!, preview, { contentType: "image/webp" });
    published.push(await insertItem(owner, { partTypeId: scene.partType.id, photoId: photo.id, status: "published", regions: key.regions, grade: key.grade, caption: key.caption }));
  }
  const draftPhoto = await createPhoto({ workspaceId: owner.workspaceId, unitId: scene.unit.id, uploadedBy: owner.userId });
  const draft = await insertItem(owner, { partTypeId: scene.partType.id, photoId: draftPhoto.id, regions: SCRATCHED });
  return { owner, partType: scene.partType, published, draft };
}

/** A set of these items, assigned to `takerId` (null: to nobody yet); the set's id. */
export async function createAssignedSet(trainer: Session, itemIds: string[], takerId: string | null, name = `Fixture set ${Date.now()}`) {
  const made = await api<{ set: { id: string } }>(trainer, "POST", "/api/calibration/sets", { name, itemIds, thresholds: { minGradeAgreement: 0.8, minMeanIou: 0.5 } });
  if (made.status !== 201) throw new Error(`Fixture set failed: ${JSON.stringify(made.body)}`);
  if (takerId === null) return { setId: made.body.set.id };
  const assigned = await api(trainer, "POST", `/api/calibration/sets/${made.body.set.id}/assignments`, { userIds: [takerId], dueOn: "2099-12-31" });
  if (assigned.status !== 200) throw new Error(`Fixture assignment failed: ${JSON.stringify(assigned.body)}`);
  return { setId: made.body.set.id };
}

/**
 * `taker` is assigned a new set of `itemIds` (by `trainer`) and takes it: the key's own answers, or
 * nothing marked and Reject throughout; submitted unless `submit: false` (left in progress).
 */
export async function takeAssignedSet(
  trainer: Session,
  taker: Session & { id: string },
  itemIds: string[],
  answers: "as the key" | "all wrong",
  { submit = true, name = `Taken set ${taker.id} ${Date.now()}` }: { submit?: boolean; name?: string } = {},
) {
  const { setId } = await createAssignedSet(trainer, itemIds, taker.id, name);
  // The taker's list names sets, not their ids: `name` is unique per call.
  const mine = await api<{ assignments: { id: string; setName: string }[] }>(taker, "GET", "/api/calibration/assignments");
  const assignment = mine.body.assignments.find((a) => a.setName === name);
  if (!assignment) throw new Error(`Fixture: ${taker.email} has no assignment of set "${name}": ${JSON.stringify(mine.body)}`);
  const started = await api<{ attemptId: string }>(taker, "POST", `/api/calibration/assignments/${assignment.id}/attempt`);
  const attemptId = started.body.attemptId;
  for (const [i, key] of KEYS.entries()) {
    const answer = answers === "as the key" ? { position: i + 1, grade: key.grade, regions: key.regions } : { position: i + 1, grade: "Reject", regions: { regions: [], surfaces: [], ruler: null } };
    const saved = await api(taker, "PUT", `/api/calibration/attempts/${attemptId}/answers`, answer);
    if (saved.status !== 200) throw new Error(`Fixture answer failed: ${JSON.stringify(saved.body)}`);
  }
  if (!submit) return { setId, attemptId, passed: null };
  const submitted = await api<{ attempt: { result: { passed: boolean } } }>(taker, "POST", `/api/calibration/attempts/${attemptId}/submit`);
  if (submitted.status !== 200) throw new Error(`Fixture submission failed: ${JSON.stringify(submitted.body)}`);
  return { setId, attemptId, passed: submitted.body.attempt.result.passed };
}
