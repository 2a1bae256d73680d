/**
 * The demo's published Gallery: for every seeded part type of the demo workspace, a normal example
 * and abnormal ones, each a synthetic photo the seed renders itself (photo-art.ts) with the
 * defects it planted, so the key regions are exact. Each goes through the app's own steps: the
 * gallery upload (intent → PUT → finalise, processed inline as the worker would), an edit that
 * sets the planted regions and the caption, then publishing.
 *
 * The grade of each example is what the part type's published example rubric says of its own
 * measured regions (measured as the Bench measures a photo), so the gallery and the rubric agree;
 * the caption states the numbers and the rule behind the grade. Invented data, demo only.
 */
import { and, asc, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { getLatestPublished } from "@/db/queries/rubrics";
import { partTypes, users, workspaces } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import type { Role } from "@/lib/auth/roles";
import { editItem, publishItem } from "@/lib/gallery/edits";
import { createGalleryUploadIntent, finaliseGalleryUpload } from "@/lib/gallery/uploads";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { measureUnit } from "@/lib/grading/grade-unit";
import type { Grade } from "@/lib/grading/rubric-schema";
import { renderAnnotatedPartPhoto, type PlantedDefect } from "./photo-art";
import { classKeyOf, surfacePolygon } from "./photo-defects";

/** Per part type: the examples to make, as [view, planted defects]; the first is the normal one. */
const EXAMPLES: Record<string, [string, PlantedDefect[]][]> = {
  "rear-camera": [
    ["front", []],
    ["front", ["scratch"]],
    ["front", ["dust"]],
    ["lens", ["dust"]],
  ],
  "front-camera": [
    ["front", []],
    ["front", ["scratch"]],
    ["front", ["chip"]],
  ],
  battery: [
    ["front", []],
    ["front", ["dent"]],
    ["back", ["swelling"]],
  ],
  "back-housing": [
    ["front", []],
    ["front", ["crack"]],
    ["front", ["scratch"]],
    ["back", ["stain"]],
  ],
  display: [
    ["front", []],
    ["front", ["scratch"]],
    ["screen-white", ["dead-pixel"]],
  ],
  "charging-flex": [
    ["front", []],
    ["front", ["corrosion"]],
    ["back", ["torn-flex"]],
  ],
  "button-flex": [
    ["front", []],
    ["front", ["torn-flex"]],
    ["front", ["stain"]],
  ],
  loudspeaker: [
    ["front", []],
    ["front", ["dent"]],
    ["front", ["dust"]],
  ],
};

const pct = (share: number) => `${(share * 100).toFixed(share < 0.001 ? 3 : 2)} %`;

async function trainerOf(workspaceId: string): Promise<SessionUser | null> {
  const [row] = await db()
    .select({ id: users.id, email: users.email, name: users.name, roles: users.roles, workspaceName: workspaces.name, timeZone: workspaces.timeZone })
    .from(users)
    .innerJoin(workspaces, eq(workspaces.id, users.workspaceId))
    .where(and(eq(users.workspaceId, workspaceId), eq(users.active, true), sql`'trainer' = ANY(${users.roles})`))
    // A trainer by trade first (not someone who also holds every other role).
    .orderBy(sql`cardinality(${users.roles})`, asc(users.email))
    .limit(1);
  return row ? { ...row, workspaceId, roles: row.roles as Role[] } : null;
}

type SeedPartType = typeof partTypes.$inferSelect;

/** The planted marks as the item's regions (with the part's outline as its Surface), its grade and caption. */
async function judge(partType: SeedPartType, viewKey: string, photo: Awaited<ReturnType<typeof renderAnnotatedPartPhoto>>, rubric: NonNullable<Awaited<ReturnType<typeof getLatestPublished>>>) {
  const known = new Set(partType.defectClasses.map((d) => d.key));
  const defects = photo.regions.map((r, i) => ({ id: `d${i + 1}`, defect: classKeyOf(r.defect), shape: r.shape })).filter((r) => known.has(r.defect));
  const surface = surfacePolygon(photo.surface);
  const regions: RegionSetPayload = { regions: defects, surfaces: [{ id: "surface", shape: surface }], ruler: null };
  const measured = await measureUnit({
    partType: { views: partType.views, defectClasses: partType.defectClasses, nominalSizeMm: partType.nominalSizeMm, panelResolution: partType.panelResolution },
    rubric: rubric.rubric,
    photos: [{ photoId: "seed", viewKey, width: photo.width, height: photo.height, regionsVersion: 0, defects, surfaces: [surface], rulers: [] }],
    functionalFailures: { critical: 0, major: 0, minor: 0 },
  });
  const proposal = measured.unit.proposal;
  const grade: Grade = proposal.grade;
  const viewLabel = partType.views.find((v) => v.key === viewKey)?.label ?? viewKey;
  let caption: string;
  if (defects.length === 0) {
    caption = `A clean ${viewLabel.toLowerCase()} view of the ${partType.name.toLowerCase()}: nothing to mark, so nothing lowers the grade — ${grade}. Compare each unit's photo with this one.`;
  } else {
    const cls = defects[0].defect;
    const label = partType.defectClasses.find((d) => d.key === cls)?.label ?? cls;
    const m = measured.photos[0].measurement.byDefect[cls];
    const length = m?.maxLengthMm ? `, ${m.maxLengthMm.toFixed(1)} mm long` : "";
    const fired = proposal.lines.find((l) => l.grade === grade && !l.ruleId.startsWith("builtin:none"));
    const why = fired ? `${fired.text.charAt(0).toUpperCase()}${fired.text.slice(1)}.` : `Below every limit of the published rubric: ${grade}.`;
    caption = `${label} on the ${viewLabel.toLowerCase()}: ${m ? pct(m.share) : "a small part"} of the part's surface${length}. ${why}`;
  }
  return { regions, grade, caption: caption.slice(0, 600) };
}

export async function seedGallery({ workspaceSlugs = ["vellmoor"] }: { workspaceSlugs?: string[] } = {}): Promise<{ items: number }> {
  let items = 0;
  for (const slug of workspaceSlugs) {
    const [ws] = await db().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, slug));
    const trainer = ws && (await trainerOf(ws.id));
    if (!trainer) continue;
    const types = await db().select().from(partTypes).where(eq(partTypes.workspaceId, ws.id)).orderBy(asc(partTypes.name));
    for (const partType of types) {
      const rubric = await getLatestPublished({ workspaceId: ws.id, partTypeId: partType.id });
      const examples = EXAMPLES[partType.slug];
      if (!rubric || !examples) continue;
      for (const [index, [wantedView, planted]] of examples.entries()) {
        const viewKey = partType.views.some((v) => v.key === wantedView) ? wantedView : partType.views[0].key;
        const photo = await renderAnnotatedPartPhoto({ kind: `${partType.slug} ${partType.category}`, viewKey, defects: planted, seed: 4242 + items * 37 });
        const { regions, grade, caption } = await judge(partType, viewKey, photo, rubric);
        const kind = regions.regions.length ? "abnormal" : "normal";
        const intent = await createGalleryUploadIntent(trainer, {
          partTypeId: partType.id,
          viewKey,
          kind,
          grade,
          fileName: `gallery-${partType.slug}-${index + 1}.jpg`,
          contentType: "image/jpeg",
          bytes: photo.jpeg.length,
        });
        const put = await fetch(intent.upload.url, { method: "PUT", headers: intent.upload.headers, body: new Uint8Array(photo.jpeg) });
        if (!put.ok) throw new Error(`the photo store refused the demo gallery upload (${put.status})`);
        const done = await finaliseGalleryUpload(trainer, { ticket: intent.ticket }, { dispatch: "inline" });
        if (done.kind !== "item") throw new Error(`the demo gallery photo for ${partType.name} was not processed`);
        const edited = await editItem(trainer, done.item.id, { revision: done.item.revision, caption, regions });
        await publishItem(trainer, edited.id, { revision: edited.revision });
        items++;
      }
    }
  }
  console.log(`Demo gallery: ${items} published examples (normal and abnormal) with their planted regions as the key.`);
  return { items };
}
