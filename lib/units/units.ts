import "server-only";
import crypto from "node:crypto";
import { transaction } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import { lockLot, setLotSampleDraw } from "@/db/queries/lots";
import { countLotUnits, insertUnits, lockUnit, updateUnitSerial } from "@/db/queries/units";
import type { SampleDraw } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { assertUnitEditable } from "./editability";
import { DRAW_ALGORITHM, drawSample } from "./sample-draw";
import { describeSerialProblems, hasSerialProblems, parseSerialCsv } from "./serial-csv";
import type { UnitsCreateInput } from "./schemas";

/** A fresh seed for a draw: 32 random bits from the operating system, as decimal text. */
export function newDrawSeed(): string {
  return String(crypto.randomBytes(4).readUInt32BE(0));
}

function serialListError(problems: string[]): AppError {
  const fieldErrors: Record<string, string> = { csv: problems[0] ?? "The list of serials is not valid." };
  problems.forEach((p, i) => (fieldErrors[`csv.${i}`] = p));
  return new AppError("bad_request", `The list of serials cannot be imported: ${problems.slice(0, 3).join("; ")}${problems.length > 3 ? "; …" : ""}. Nothing was stored.`, { fieldErrors });
}

/**
 * Makes a lot's sampled units, once: either drawn at random from the supplier's list of serials
 * (seeded, reproducible; the seed, list size and list hash are stored with the lot) or numbered
 * placeholders whose serials the inspector scans on the bench.
 */
export async function createLotUnits(actor: SessionUser, lotId: string, input: UnitsCreateInput) {
  return transaction(async (tx) => {
    const lot = await lockLot(tx, { workspaceId: actor.workspaceId, lotId });
    if (!lot) throw notFound("That lot");
    if (lot.status !== "open") throw new AppError("conflict", "This lot is decided; its sample can no longer change.");
    const existing = await countLotUnits({ workspaceId: actor.workspaceId, lotId }, tx);
    if (existing > 0) throw new AppError("conflict", `This lot already has its ${existing} sampled units; the sample is drawn once.`);
    const sampleSize = lot.plan.sampleSize;
    const drawnAt = new Date().toISOString();
    let serials: (string | null)[];
    let draw: SampleDraw;
    let seed: string | null = null;
    if (input.source === "serials") {
      const parsed = parseSerialCsv(input.csv);
      if (hasSerialProblems(parsed)) throw serialListError(describeSerialProblems(parsed));
      const pool = parsed.serials.map((s) => s.serial);
      if (pool.length > lot.quantity) {
        throw new AppError(
          "bad_request",
          `The list has ${pool.length.toLocaleString("en-GB")} serials but the lot has ${lot.quantity.toLocaleString("en-GB")} units; check that this is the right list. Nothing was stored.`,
          {
            fieldErrors: { csv: "More serials than units in the lot." },
          },
        );
      }
      if (pool.length < sampleSize) {
        throw new AppError(
          "bad_request",
          `The plan needs ${sampleSize} units but the list has ${pool.length} serials. Import the full list, or use numbered placeholders and scan serials on the bench. Nothing was stored.`,
          {
            fieldErrors: { csv: `At least ${sampleSize} serials are needed.` },
          },
        );
      }
      seed = input.seed ?? newDrawSeed();
      serials = drawSample(pool, sampleSize, seed);
      const poolSha256 = crypto.createHash("sha256").update(pool.join("\n")).digest("hex");
      draw = { source: "serials", poolSize: pool.length, poolSha256, seed, algorithm: DRAW_ALGORITHM, drawnAt, drawnBy: actor.id };
    } else {
      serials = Array.from({ length: sampleSize }, () => null);
      draw = { source: "placeholders", drawnAt, drawnBy: actor.id };
    }
    const rows = serials.map((serial, i) => ({
      workspaceId: actor.workspaceId,
      lotId,
      sampleIndex: i + 1,
      serial,
      placeholder: serial === null,
      partTypeId: lot.partTypeId,
      supplierId: lot.supplierId,
      lotDueOn: lot.dueOn,
      lotReceivedOn: lot.receivedOn,
      lotCreatedAt: lot.createdAt,
    }));
    await insertUnits(tx, rows);
    await setLotSampleDraw(tx, { workspaceId: actor.workspaceId, lotId, seed, draw });
    await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "lot.units_created", subjectType: "lot", subjectId: lotId, detail: { ...draw, units: rows.length } });
    return { created: rows.length, draw };
  });
}

/** Sets the serial of a placeholder unit (scanned or typed on the bench). */
export async function setUnitSerial(actor: SessionUser, unitId: string, serial: string) {
  try {
    return await transaction(async (tx) => {
      const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId });
      if (!unit) throw notFound("That unit");
      assertUnitEditable({ work: "serial", actor, lotStatus: unit.lotStatus, unit, timeZone: actor.timeZone });
      if (!unit.placeholder) throw new AppError("conflict", "This unit's serial came from the supplier's list and cannot be edited here.", { fieldErrors: { serial: "Imported serials are fixed." } });
      const row = await updateUnitSerial(tx, { workspaceId: actor.workspaceId, unitId, serial });
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "unit.serial_set", subjectType: "unit", subjectId: unitId, detail: { from: unit.serial, to: serial } });
      return row;
    });
  } catch (err) {
    if (isUniqueViolation(err, "units_lot_serial_key")) {
      throw new AppError("conflict", `Another unit of this lot already has the serial ${serial}.`, { fieldErrors: { serial: "Already used in this lot." } });
    }
    throw err;
  }
}
