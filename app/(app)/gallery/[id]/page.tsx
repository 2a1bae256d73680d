import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { GalleryItemScreen } from "@/components/gallery/item-screen";
import { getGradingPartType } from "@/db/queries/rubrics";
import { requirePageUser } from "@/lib/auth/require-user";
import { AppError } from "@/lib/errors";
import { canEditGallery } from "@/lib/gallery/access";
import { readGalleryItem } from "@/lib/gallery/items";
import { pageIdOrNotFound } from "@/lib/http/page-params";

export const metadata: Metadata = { title: "Gallery item" };

/** One gallery item: a thin server composition; GalleryItemScreen shows and (for editors) edits it. */
export default async function GalleryItemPage(props: PageProps<"/gallery/[id]">) {
  const { id: rawId } = await props.params;
  const user = await requirePageUser({ permission: "gallery.read", from: `/gallery/${rawId}` });
  const id = pageIdOrNotFound(rawId);
  const item = await readGalleryItem(user, id).catch((err: unknown) => {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  });
  const partType = await getGradingPartType({ workspaceId: user.workspaceId, partTypeId: item.partType.id });
  if (!partType) notFound();
  return <GalleryItemScreen initial={item} partType={{ views: partType.views, defectClasses: partType.defectClasses }} canEdit={canEditGallery(user.roles)} />;
}
