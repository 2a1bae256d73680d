import { promotePhoto } from "@/lib/gallery/edits";
import { galleryListAnswer } from "@/lib/gallery/list-answer";
import { promoteSchema } from "@/lib/gallery/schemas";
import { handler, parseJson } from "@/lib/http/route";

/**
 * A page of gallery items, newest first: published for everyone; editors also see drafts (and
 * retired on request). The production server answers this one itself, without Next.js's request
 * handling (lib/http/node-routes.ts, same answer and permission); this handler serves `next dev`.
 */
export const GET = handler({ permission: "gallery.read" }, async (req, _ctx, user) => {
  // Already JSON (the cards come as text from the database, lib/gallery/items.ts).
  return new Response(await galleryListAnswer(new URL(req.url).searchParams, user), { headers: { "Content-Type": "application/json" } });
});

/** Promote a graded unit's photo: its regions and the unit's grade become a draft (201). */
export const POST = handler({ permission: "gallery.edit" }, async (req, _ctx, user) => {
  const input = await parseJson(req, promoteSchema);
  return Response.json({ item: await promotePhoto(user, input) }, { status: 201 });
});
