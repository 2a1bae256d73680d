import "server-only";
import type { SessionUser } from "@/lib/auth/session-user";
import { parseSearchParams } from "@/lib/validation";
import { listGalleryJson } from "./items";
import { galleryListQuerySchema } from "./schemas";

/**
 * GET /api/gallery's answer, { items, nextCursor } as JSON text, for the App Router handler
 * (app/api/gallery/route.ts) and the production server's plain Node route (lib/http/node-routes.ts) alike.
 */
export function galleryListAnswer(params: URLSearchParams, user: SessionUser): Promise<string> {
  return listGalleryJson(user, parseSearchParams(params, galleryListQuerySchema));
}
