/**
 * Keyset cursors for the Gallery list: the (created_at, id) of the last item of a page, as
 * base64url JSON. The order is newest first and total (the id breaks ties), so pages never skip
 * or repeat an item while others are added.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";

export type GalleryCursor = { createdAt: string; id: string };

const cursorSchema = z.strictObject({ createdAt: z.iso.datetime({ offset: true }), id: z.uuid() });

export const encodeGalleryCursor = (key: GalleryCursor): string => Buffer.from(JSON.stringify(key)).toString("base64url");

export function decodeGalleryCursor(cursor: string): GalleryCursor {
  try {
    return cursorSchema.parse(JSON.parse(Buffer.from(cursor, "base64url").toString("utf8")));
  } catch {
    throw new AppError("bad_request", "The page link is not valid; start again from the first page.");
  }
}

export const isGalleryCursor = (cursor: string): boolean => {
  try {
    decodeGalleryCursor(cursor);
    return true;
  } catch {
    return false;
  }
};
