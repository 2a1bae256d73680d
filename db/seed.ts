/**
 * Seeds the invented demo scenario into an empty database (refuses to touch a database that
 * already has workspaces). Run with `npm run db:seed`; `npm start` runs it when the database is empty.
 */
import { sql } from "drizzle-orm";
import { closeDb, db } from "./client";
import { seedCalibration } from "./seed/calibration";
import { seedEvidence } from "./seed/evidence";
import { seedGallery } from "./seed/gallery";
import { seedLots } from "./seed/lots";
import { seedPartTypes } from "./seed/part-types";
import { seedPeople } from "./seed/people";
import { seedPhotos } from "./seed/photos";
import { seedRechecks } from "./seed/rechecks";
import { seedCertificate, seedSupplierParetos } from "./seed/certificates";
import { seedRubrics } from "./seed/rubrics";
import { seedSuggestionModel } from "./seed/suggestion-model";

export async function isDatabaseEmpty(): Promise<boolean> {
  const { rows } = await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM workspaces`);
  return rows[0]?.n === 0;
}

export async function seedDemo() {
  if (!(await isDatabaseEmpty())) return { seeded: false as const };
  const people = await seedPeople(db());
  // Part types for both workspaces, then the Vellmoor lots with their units and checklist results.
  const partTypes = await seedPartTypes(db(), people);
  const lots = await seedLots(db(), people);
  // Must run after the part types are seeded (it publishes example rubrics for the seeded ones).
  const rubrics = await seedRubrics(db());
  // Evidence packs and claims on the decided lots the supplier was told about.
  const evidence = await seedEvidence(people);
  // Last: photographs the units the steps above created, through the upload pipeline.
  const photos = await seedPhotos();
  // Needs the published rubrics (each example's grade is what its rubric says of its regions).
  const gallery = await seedGallery();
  // A calibration set of those examples with one passing and one failing attempt.
  const calibration = await seedCalibration();
  // Needs the photos' planted marks and the rubrics: recheck history for the scorecards, a recheck to do, a disagreement to settle.
  const rechecks = await seedRechecks("vellmoor", photos.planted);
  // A clean photographed unit graded and certified through the app's own steps (after the rechecks, so their draw is as before).
  const certificate = await seedCertificate("vellmoor", photos.planted);
  // Each supplier's scorecard Pareto has bars: a supplier no step above graded gets its flawed photographed unit graded as planted.
  const paretos = await seedSupplierParetos("vellmoor", photos.planted);
  // So a newcomer's Bench shows learned ghosts (the demo has too few marked regions to train on).
  const suggestionModel = await seedSuggestionModel();
  return {
    seeded: true as const,
    people,
    partTypes,
    lots,
    rubrics,
    evidence,
    photos: { photos: photos.photos, units: photos.units, reused: photos.reused },
    gallery,
    calibration,
    rechecks,
    certificate,
    paretos,
    suggestionModel,
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await seedDemo();
  console.log(result.seeded ? "Demo data seeded." : "The database already has data; seed skipped.");
  await closeDb();
}
