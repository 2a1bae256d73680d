/** The People list's sort in the URL (`/people?sort=email&dir=desc`); the whole list is loaded and sorted in the browser. */
import { z } from "zod";

export const PEOPLE_SORTS = ["name", "email", "status"] as const;

export const peopleListParamsSchema = z
  .object({
    sort: z.enum(PEOPLE_SORTS).default("name"),
    dir: z.enum(["asc", "desc"]).default("asc"),
  })
  .strict();
export type PeopleListParams = z.infer<typeof peopleListParamsSchema>;
