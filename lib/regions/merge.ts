/**
 * Three-way merge of a photo's region set, for a save that met someone else's newer save (409):
 * `base` is what this editor last saved (or loaded), `mine` what it holds now, `theirs` what the
 * server holds now. Regions are matched by id (ids are unique per editing session, so two tabs
 * never make the same id for different regions).
 *
 * Per id: changed only on one side → that side wins; changed the same way on both → that; changed
 * differently on both → mine is kept (the person at this screen sees it and can still take theirs)
 * and the conflict is named. One exception keeps evidence from vanishing: a region I deleted but
 * they changed stays (theirs), because a region that exists can be deleted again, a lost one
 * cannot be recovered. A photo has one ruler: if both sides hold a different one, mine is kept.
 * Order: mine's order, then regions only they have, in their order. Pure.
 */
import type { RegionSetPayload } from "@/lib/geometry/validate";
import { TOOL_NAME_BY_KIND } from "@/lib/geometry/validate";
import { canonicalJson } from "./payload";

type Entry =
  | { id: string; kind: "surface"; value: RegionSetPayload["surfaces"][number] }
  | { id: string; kind: "defect"; value: RegionSetPayload["regions"][number] }
  | { id: string; kind: "ruler"; value: NonNullable<RegionSetPayload["ruler"]> };

export type MergeResult = {
  payload: RegionSetPayload;
  /** One sentence per region changed differently on both sides. */
  conflicts: string[];
  /** How many regions took the other side's version (added, changed or deleted there). */
  takenFromTheirs: number;
};

function entriesOf(payload: RegionSetPayload): Entry[] {
  const list: Entry[] = [...payload.surfaces.map((value): Entry => ({ id: value.id, kind: "surface", value })), ...payload.regions.map((value): Entry => ({ id: value.id, kind: "defect", value }))];
  if (payload.ruler) list.push({ id: payload.ruler.id, kind: "ruler", value: payload.ruler });
  return list;
}

const keyOf = (entry: Entry | undefined) => (entry ? canonicalJson(entry.value) : "");

function describe(entry: Entry): string {
  if (entry.kind === "surface") return "A Surface outline";
  if (entry.kind === "ruler") return "The Ruler";
  return `A ${TOOL_NAME_BY_KIND[entry.value.shape.kind]} (${entry.value.defect})`;
}

export function mergeRegionSets({ base, mine, theirs }: { base: RegionSetPayload; mine: RegionSetPayload; theirs: RegionSetPayload }): MergeResult {
  const b = new Map(entriesOf(base).map((e) => [e.id, e]));
  const m = new Map(entriesOf(mine).map((e) => [e.id, e]));
  const t = new Map(entriesOf(theirs).map((e) => [e.id, e]));
  const order = [...m.keys(), ...[...t.keys()].filter((id) => !m.has(id))];
  const conflicts: string[] = [];
  let takenFromTheirs = 0;
  const chosen: { entry: Entry; from: "mine" | "theirs" }[] = [];

  // An id only in `base` was deleted on both sides: nothing to keep.
  for (const id of order) {
    const [be, me, te] = [b.get(id), m.get(id), t.get(id)];
    const mineChanged = keyOf(me) !== keyOf(be);
    const theirsChanged = keyOf(te) !== keyOf(be);
    let pick: Entry | undefined;
    let from: "mine" | "theirs" = "mine";
    if (!mineChanged) {
      pick = te;
      from = "theirs";
      if (theirsChanged) takenFromTheirs++;
    } else if (!theirsChanged || keyOf(me) === keyOf(te)) {
      pick = me;
    } else if (!me) {
      pick = te;
      from = "theirs";
      takenFromTheirs++;
      conflicts.push(`${describe(te!)} you deleted was changed in the other session; it is kept.`);
    } else {
      pick = me;
      conflicts.push(`${describe(me)} was changed in both sessions${te ? "" : " (deleted in the other)"}; your version is kept.`);
    }
    if (pick) chosen.push({ entry: pick, from });
  }

  // One ruler per photo: mine wins over theirs when both sides placed a different one.
  const rulers = chosen.filter((c) => c.entry.kind === "ruler");
  const ruler = rulers.find((c) => c.from === "mine") ?? rulers[0];
  if (rulers.length > 1) conflicts.push("Both sessions placed a Ruler; yours is kept.");

  const payload: RegionSetPayload = { regions: [], surfaces: [], ruler: ruler ? (ruler.entry.value as RegionSetPayload["ruler"]) : null };
  for (const { entry } of chosen) {
    if (entry.kind === "surface") payload.surfaces.push(entry.value);
    else if (entry.kind === "defect") payload.regions.push(entry.value);
  }
  return { payload, conflicts, takenFromTheirs };
}
