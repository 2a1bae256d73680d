import "server-only";
import { GalleryRevisionConflict } from "./edits";

/** Runs a change; a revision conflict answers 409 with the current item, so the page can reload it. */
export async function galleryConflictResponse(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (err) {
    if (!(err instanceof GalleryRevisionConflict)) throw err;
    return Response.json({ error: { code: err.code, message: err.message }, current: err.current }, { status: 409 });
  }
}
