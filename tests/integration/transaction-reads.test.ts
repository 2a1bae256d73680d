/**
 * Reads that lib runs inside a transaction go one after the other on its client (db/run-reads.ts):
 * pg 8 prints a deprecation warning when a second query is queued on a client that is still
 * running one ("already executing a query"), and pg 9 will refuse it. Against the test database,
 * no mocks. This file holds only this test: pg warns once per process, so an earlier test in the
 * same file could hide it.
 */
import { afterAll, beforeAll, expect, it } from "vitest";
import { transaction } from "@/db/client";
import { loadLotEvidence } from "@/db/queries/lots";
import { switchingStateFor } from "@/lib/lots/scheme";
import { readRegionSet } from "@/lib/regions/regions";
import { createPartType, createPhoto, createUnit, workspaceIdOf } from "../support/grading";

const warnings: string[] = [];
const onWarning = (warning: Error) => warnings.push(warning.message);

beforeAll(() => {
  process.on("warning", onWarning);
});
afterAll(() => {
  process.off("warning", onWarning);
});

it("reads region sets, switching state and lot evidence in a transaction without queuing queries on its client", async () => {
  const owner = await workspaceIdOf("lead@vellmoor.example");
  const partType = await createPartType(owner.workspaceId);
  const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId });
  const actor = { workspaceId: owner.workspaceId, id: owner.userId, roles: ["lead" as const] };

  const [set, switching, evidence] = await transaction(async (tx) => [
    await readRegionSet(actor, photo.id, tx),
    await switchingStateFor({ workspaceId: owner.workspaceId, supplierId: unit.supplierId, partTypeId: partType.id }, tx),
    await loadLotEvidence({ workspaceId: owner.workspaceId, lotIds: [unit.lotId] }, tx),
  ]);
  expect(set).toMatchObject({ photoId: photo.id, version: 0 });
  expect(switching.decidedLots).toBe(0);
  expect(evidence.units.map((u) => u.id)).toEqual([unit.id]);
  // Warnings are emitted on the next tick.
  await new Promise((resolve) => setImmediate(resolve));
  expect(warnings.filter((m) => m.includes("already executing a query"))).toEqual([]);
});
